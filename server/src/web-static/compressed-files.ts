import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import { promisify } from 'node:util';
import zlib from 'node:zlib';
import type { RequestHandler } from 'express';

/**
 * The web app's content-hashed files, compressed once and then sent from memory (issue 15, cold opens).
 *
 * A cold open of a study asks for about 85 files; compressing each on every request (the `compression`
 * middleware) cost about 100 ms of CPU per open on this 2-core machine (Plotly alone 61 ms at Brotli 4),
 * beside the browser that is waiting for them. A file whose name carries its content hash never
 * changes, so it is compressed once, better (Brotli 9, gzip 9), off the event loop: for Brotli every such
 * file from the server's start, for gzip when first asked. Until a copy is ready its requests go on to
 * the ordinary path (compressed on the fly) and lose nothing.
 */

/**
 * A file named after its content: `name-HASH8.ext` as esbuild names what the Angular build hashes (base
 * 32, upper case), or `chunk-hash8.js` as the chunk optimizer (rolldown) names its chunks (base 64 for
 * URLs: letters of both cases, digits, `-` and `_`).
 */
const HASHED_STEM = String.raw`(?:[\w.-]+-[A-Z0-9]{8}|chunk-[\w-]{8})`;
export const HASHED_NAME = new RegExp(String.raw`^${HASHED_STEM}\.[a-z0-9]+$`);
/** A request for such a file, of a kind compressed here. */
const HASHED = new RegExp(String.raw`^\/(${HASHED_STEM}\.(?:js|css|svg|json|txt|map))$`);
const brotli = promisify(zlib.brotliCompress);
const gzip = promisify(zlib.gzip);

type Encoding = 'br' | 'gzip';

export function compressedFiles(webDir: string): RequestHandler {
  const ready = new Map<string, Buffer>();
  const started = new Set<string>();

  const compress = (name: string, encoding: Encoding): Promise<void> => {
    const key = `${encoding}:${name}`;
    if (started.has(key)) return Promise.resolve();
    started.add(key);
    return (
      readFile(path.join(webDir, name))
        .then((raw) =>
          encoding === 'br'
            ? brotli(raw, { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 9, [zlib.constants.BROTLI_PARAM_SIZE_HINT]: raw.length } })
            : gzip(raw, { level: 9 }),
        )
        .then((body) => void ready.set(key, body))
        // A file that is not there (or not readable) is the ordinary path's to answer.
        .catch(() => undefined)
    );
  };

  // Every hashed file for Brotli (what browsers ask for), one after another from the start, so the
  // first open does not pay for it (about 1 s of CPU for the whole app, in the thread pool).
  void readdir(webDir)
    .then(async (names) => {
      for (const name of names) if (HASHED.test(`/${name}`)) await compress(name, 'br');
    })
    .catch(() => undefined);

  return (req, res, next) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') return next();
    const name = HASHED.exec(req.path)?.[1];
    if (!name) return next();
    const accepted = req.acceptsEncodings('br', 'gzip', 'identity');
    if (accepted !== 'br' && accepted !== 'gzip') return next();
    const body = ready.get(`${accepted}:${name}`);
    if (!body) {
      compress(name, accepted);
      return next();
    }
    res.setHeader('cache-control', 'public, max-age=31536000, immutable');
    res.setHeader('content-encoding', accepted);
    res.setHeader('vary', 'Accept-Encoding');
    res.type(path.extname(name));
    res.setHeader('content-length', body.length);
    res.end(req.method === 'HEAD' ? undefined : body);
  };
}
