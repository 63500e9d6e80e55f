import type { Express, RequestHandler, Router } from 'express';
import type { z } from 'zod';
import { CELL_INPUT_SCHEMAS, fieldLabel as cellFieldLabel, isId, jsonFault, PATH_ID_LABELS, PRESSURE_TEXT_LIMIT, requestFieldLabel, textFault, type CellKind } from '@laminote/contracts';
import { badRequest } from './problem';

/**
 * The API's edge: what every request is checked for before a handler sees it, whatever the route.
 * Text that PostgreSQL cannot store, numbers that are not finite, hostile nesting, unknown or oversized
 * cell inputs and malformed ids in the path each answer 400 problem+json naming the field by its
 * label on screen, never 500.
 */

/**
 * Largest serialised inputs of one cell. Twice what its fields may validly hold: a table or note a
 * little over its limit is still saved as typed, with the problem shown in the cell (nothing typed is
 * lost); far beyond it is refused. A pressure cell holds its whole table; the others are small.
 */
export function cellInputsLimit(kind: CellKind): number {
  return kind === 'pressure' ? 2 * PRESSURE_TEXT_LIMIT : 1024 * 1024;
}

/** The input fields a cell kind has: its schema's keys. */
function inputKeys(kind: CellKind): Set<string> {
  const schema = CELL_INPUT_SCHEMAS[kind] as unknown as { shape?: Record<string, z.ZodType> };
  return new Set(Object.keys(schema.shape ?? {}));
}

const KIND_KEYS = new Map<string, Set<string>>(Object.keys(CELL_INPUT_SCHEMAS).map((kind) => [kind, inputKeys(kind as CellKind)]));

/**
 * A cell carried in a body (a draft save): its inputs may only hold its kind's fields, within its
 * size. Values are checked by the kind's schema when the cell runs (a draft keeps what was typed).
 */
function cellsFault(body: unknown): ReturnType<typeof badRequest> | null {
  if (!body || typeof body !== 'object' || !Array.isArray((body as { cells?: unknown }).cells)) return null;
  const cells = (body as { cells: unknown[] }).cells;
  for (const [index, cell] of cells.entries()) {
    if (!cell || typeof cell !== 'object') continue;
    const { kind, inputs } = cell as { kind?: unknown; inputs?: unknown };
    const keys = typeof kind === 'string' ? KIND_KEYS.get(kind) : undefined;
    if (!keys || !inputs || typeof inputs !== 'object' || Array.isArray(inputs)) continue;
    const unknown = Object.keys(inputs).find((key) => !keys.has(key));
    if (unknown !== undefined) {
      const path = ['cells', index, 'inputs', unknown];
      return badRequest(`${label(path, body)}: a ${kind} cell has no such input`, formatField(path));
    }
    const size = JSON.stringify(inputs).length;
    const limit = cellInputsLimit(kind as CellKind);
    if (size > limit) {
      const path = ['cells', index, 'inputs'];
      return badRequest(`${label(path, body)}: the inputs of one cell are limited to ${Math.round(limit / 1024)} KiB (these are ${Math.round(size / 1024)} KiB)`, formatField(path));
    }
  }
  return null;
}

/** A request path in screen words; a cell's inputs by their labels in the cell (body.cells[i].kind). */
function label(path: readonly (string | number)[], body?: unknown): string {
  const cells = body && typeof body === 'object' ? (body as { cells?: unknown }).cells : undefined;
  return requestFieldLabel(path, (index, key) => {
    const kind = Array.isArray(cells) ? (cells[index] as { kind?: unknown } | undefined)?.kind : undefined;
    return typeof kind === 'string' && KIND_KEYS.has(kind) ? cellFieldLabel(kind as CellKind, key) : undefined;
  });
}

function formatField(path: readonly (string | number)[]): string {
  return path.reduce<string>((out, key) => (typeof key === 'number' ? `${out}[${key}]` : out ? `${out}.${key}` : key), '');
}

/** Mounted after the body parsers: refuses what no handler can store, before any handler runs. */
export const inputGuard: RequestHandler = (req, _res, next) => {
  const body = req.body as unknown;
  if (body !== undefined && body !== null && typeof body === 'object') {
    const fault = jsonFault(body);
    if (fault) return next(badRequest(`${label(fault.path, body)} ${fault.message}.`, formatField(fault.path) || 'body'));
    const cells = cellsFault(body);
    if (cells) return next(cells);
  }
  const query = jsonFault(req.query);
  if (query) return next(badRequest(`${label(query.path)} (in the address) ${query.message}.`, formatField(query.path) || 'query'));
  next();
};

/** Checks one path parameter: an id must look like one, any other value must be storable text. */
function pathParamCheck(name: string) {
  return (_req: unknown, _res: unknown, next: (err?: unknown) => void, value: unknown) => {
    const text = typeof value === 'string' ? value : '';
    if (name.endsWith('Id')) {
      if (!isId(text)) {
        const what = PATH_ID_LABELS[name] ?? label([name.slice(0, -2)]).toLowerCase();
        return next(badRequest(`The address does not name a ${what}: "${printable(text)}" is not a ${what} id.`, name));
      }
    } else {
      const fault = textFault(text);
      if (fault) return next(badRequest(`${label([name])} (in the address) ${fault}.`, name));
    }
    next();
  };
}

/** A value safe to put in a message: broken characters shown as escapes, and not too long. */
function printable(value: string): string {
  const shown = value.replace(/[\u0000-\u001f\uD800-\uDFFF]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
  return shown.length > 60 ? `${shown.slice(0, 57)}…` : shown;
}

interface LayerLike {
  route?: { path: string | string[]; methods: Record<string, boolean> };
  handle?: unknown;
  rawPath?: unknown;
}

function isRouter(handle: unknown): handle is Router & { stack: LayerLike[] } {
  return typeof handle === 'function' && Array.isArray((handle as { stack?: unknown }).stack) && typeof (handle as { param?: unknown }).param === 'function';
}

function rootRouter(app: Express): Router & { stack: LayerLike[] } {
  const router = (app as unknown as { router?: unknown }).router;
  if (!isRouter(router)) throw new Error('the Express app has no router yet');
  return router;
}

/** One route of the mounted app. */
export interface RouteEntry {
  method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  /** The full path with its parameters, as Express matches it: `/api/projects/:projectId`. */
  path: string;
  /** Its path parameters, in order. */
  params: string[];
}

const paramsOf = (path: string) => [...path.matchAll(/:(\w+)/g)].map((m) => m[1]!);

/**
 * Every route of the app, read from the mounted Express routers (not from a list kept by hand), so a
 * route added anywhere is in the table the role matrix and the hostile-input tests walk.
 */
export function routeTable(app: Express): RouteEntry[] {
  const routes: RouteEntry[] = [];
  const walk = (router: { stack: LayerLike[] }, prefix: string) => {
    for (const layer of router.stack) {
      if (layer.route) {
        const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
        for (const p of paths) {
          if (typeof p !== 'string') continue;
          for (const [method, on] of Object.entries(layer.route.methods)) {
            const upper = method.toUpperCase();
            if (!on || !['GET', 'POST', 'PUT', 'PATCH', 'DELETE'].includes(upper)) continue;
            // A resource router's own root (`router.get('/')` mounted at /api/inbox) is the prefix itself.
            const path = p === '/' && prefix !== '' ? prefix : `${prefix}${p}`;
            routes.push({ method: upper as RouteEntry['method'], path, params: paramsOf(path) });
          }
        }
      } else if (isRouter(layer.handle)) {
        const mount = typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? layer.rawPath : '';
        walk(layer.handle, `${prefix}${mount}`);
      }
    }
  };
  walk(rootRouter(app), '');
  const seen = new Set<string>();
  return routes.filter((r) => {
    const key = `${r.method} ${r.path}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

/**
 * Registers a check on every path parameter of every route in the app's routers: ids (`…Id`) must be
 * ids, anything else storable text. Called once the routers are mounted, so a route added later in
 * any router is covered without being listed anywhere.
 */
export function checkPathParams(app: Express): void {
  const walk = (router: Router & { stack: LayerLike[] }) => {
    const names = new Set<string>();
    for (const layer of router.stack) {
      if (layer.route) {
        const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
        for (const p of paths) if (typeof p === 'string') for (const name of paramsOf(p)) names.add(name);
      } else if (isRouter(layer.handle)) walk(layer.handle);
      // A router mounted at a path with parameters (`/studies/:studyId`) checks them where it is mounted.
      if (!layer.route && typeof layer.rawPath === 'string') for (const name of paramsOf(layer.rawPath)) names.add(name);
    }
    for (const name of names) router.param(name, pathParamCheck(name));
  };
  walk(rootRouter(app));
}
