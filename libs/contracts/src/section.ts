import { z } from 'zod';
import { SECTION_LIMITS } from './limits';

/**
 * Sections and bodies of revolution given by their shape (issue 14): the inviscid solution the engine
 * computes from them, and what a section cell and a polar cell hold. The engine case may carry
 * `section` or `body` instead of `surfaces` or `pressureTable` (engine.ts).
 */

export { SECTION_LIMITS } from './limits';

const finite = (label: string) => z.number({ error: `${label} must be a number` }).refine(Number.isFinite, { error: `${label} must be a finite number` });

export const sectionSpecSchema = z
  .strictObject({
    /** Pasted `x y` coordinates: a closed loop from the trailing edge, or two surfaces from the nose. */
    coordinates: z.string().max(SECTION_LIMITS.maxCoordinateCharacters, { error: `longer than ${SECTION_LIMITS.maxCoordinateCharacters} characters (limit)` }).optional(),
    /** A NACA four- or five-digit designation, e.g. `2412` or `23012`. */
    naca: z.string().max(24, { error: 'a NACA designation has 4 or 5 digits' }).optional(),
    /** Incidence in degrees (one of alphaDeg or cl). */
    alphaDeg: finite('alphaDeg').min(-25, { error: 'alphaDeg must lie between -25 and 25' }).max(25, { error: 'alphaDeg must lie between -25 and 25' }).optional(),
    /** Target lift coefficient (one of alphaDeg or cl). */
    cl: finite('cl').min(-3, { error: 'cl must lie between -3 and 3' }).max(3, { error: 'cl must lie between -3 and 3' }).optional(),
    panels: z
      .number()
      .int({ error: 'panels must be a whole number' })
      .min(SECTION_LIMITS.minPanels, { error: `panels must be at least ${SECTION_LIMITS.minPanels}` })
      .max(SECTION_LIMITS.maxPanels, { error: `panels must be at most ${SECTION_LIMITS.maxPanels}` })
      .default(160),
  })
  .superRefine((spec, ctx) => {
    const hasCoordinates = spec.coordinates !== undefined && spec.coordinates.trim() !== '';
    const hasNaca = spec.naca !== undefined && spec.naca.trim() !== '';
    if (hasCoordinates === hasNaca) ctx.addIssue({ code: 'custom', path: ['coordinates'], message: 'give exactly one of coordinates or naca' });
    if ((spec.alphaDeg === undefined) === (spec.cl === undefined)) ctx.addIssue({ code: 'custom', path: ['alphaDeg'], message: 'give exactly one of alphaDeg or cl' });
  });

export const bodySpecSchema = z.strictObject({
  /** Pasted `x r` rows along the meridian from the nose (r = 0) to the tail (r = 0). */
  coordinates: z.string().max(SECTION_LIMITS.maxCoordinateCharacters, { error: `longer than ${SECTION_LIMITS.maxCoordinateCharacters} characters (limit)` }),
  panels: z.number().int().min(SECTION_LIMITS.minPanels).max(SECTION_LIMITS.maxPanels).default(120),
});

export type SectionSpec = z.infer<typeof sectionSpecSchema>;
export type SectionSpecInput = z.input<typeof sectionSpecSchema>;
export type BodySpec = z.infer<typeof bodySpecSchema>;

export const sectionGeometrySchema = z.object({
  thickness: z.number(),
  thicknessAt: z.number(),
  camber: z.number(),
  camberAt: z.number(),
  leadingEdgeRadius: z.number().nullable(),
  trailingEdgeGap: z.number(),
});

/** The panel solution of a section: at the panel midpoints, Cp with the compressibility rule applied. */
export const sectionInviscidSchema = z.object({
  kind: z.literal('section'),
  cl: z.number(),
  /** Moment about the quarter chord, nose up positive. */
  cm: z.number(),
  alphaDeg: z.number(),
  mach: z.number(),
  x: z.array(z.number()),
  y: z.array(z.number()),
  /** Kármán–Tsien at mach > 0 (incompressible otherwise). */
  cp: z.array(z.number()),
  /** Prandtl–Glauert, shown beside it; null when mach = 0. */
  cpPrandtlGlauert: z.array(z.number()).nullable(),
  /** Sonic Cp at this Mach number; null when mach = 0. */
  criticalCp: z.number().nullable(),
  /** Free-stream Mach at which the Kármán–Tsien minimum Cp becomes sonic, at this incidence. */
  criticalMach: z.number().nullable(),
  panels: z.number(),
});

export const bodyInviscidSchema = z.object({
  kind: z.literal('body'),
  x: z.array(z.number()),
  r: z.array(z.number()),
  cp: z.array(z.number()),
  panels: z.number(),
});

export const inviscidResultSchema = z.discriminatedUnion('kind', [sectionInviscidSchema, bodyInviscidSchema]);
export type SectionInviscid = z.infer<typeof sectionInviscidSchema>;
export type BodyInviscid = z.infer<typeof bodyInviscidSchema>;
export type InviscidResult = z.infer<typeof inviscidResultSchema>;
