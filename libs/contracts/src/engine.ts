import { z } from 'zod';
import { TRANSITION_CAUSES, TRANSITION_CRITERIA } from './cell-kinds';
import { bodySpecSchema, inviscidResultSchema, sectionSpecSchema } from './section';

/**
 * The engine contract (DESIGN.md, "The engine contract"): the case the boundary-layer engine analyses
 * and the result it returns. The API, the worker threads, the job queue and the command line all
 * validate with these schemas, so they refuse the same things with the same field names.
 *
 * Lengths are divided by the reference length L (usually the chord); velocities by V∞.
 */

export { TRANSITION_CAUSES, TRANSITION_CRITERIA, type TransitionCause, type TransitionCriterion } from './cell-kinds';

/** Size limits of one case; larger input is refused with these numbers in the message. */
export const ENGINE_LIMITS = {
  maxSurfaces: 16,
  maxStationsPerSurface: 100_000,
  maxTableCharacters: 8_000_000,
  maxTableRows: 200_000,
} as const;

const positive = () => z.number({ error: 'must be a number' }).positive({ error: 'must be greater than zero' });

const flowSchema = z
  .strictObject({
    /** V∞ L / ν∞. */
    reynolds: positive().max(1e10, { error: 'above 1e10 is outside the engine range' }).optional(),
    /** ISA pressure (geopotential) altitude. */
    altitude_m: z.number().min(-5000, { error: 'below -5000 m is outside the standard atmosphere' }).max(80_000, { error: 'above 80000 m is outside the standard atmosphere' }).optional(),
    referenceLength_m: positive().optional(),
    isaTemperatureOffset_K: z.number().min(-100).max(100).optional(),
    /** Free-stream Mach number; 0 means incompressible. */
    mach: z.number().min(0, { error: 'mach must not be negative' }).optional(),
    /** Critical amplification exponent of the e^N method. */
    nCrit: positive().max(30, { error: 'above 30 is not physical' }).optional(),
    /** Free-stream turbulence intensity as a fraction (0.0007 = 0.07 %). */
    turbulenceIntensity: positive().max(0.5, { error: 'is a fraction (0.001 = 0.1 %) and at most 0.5' }).optional(),
  })
  .superRefine((flow, ctx) => {
    const mach = flow.mach ?? 0;
    if (mach >= 1) {
      ctx.addIssue({ code: 'custom', path: ['mach'], message: `supersonic free stream (mach ${mach}) is outside the engine range; give 0 <= mach < 1` });
      return;
    }
    const atmosphereGiven = flow.altitude_m !== undefined || flow.referenceLength_m !== undefined || flow.isaTemperatureOffset_K !== undefined;
    if (flow.reynolds !== undefined) {
      if (atmosphereGiven) {
        ctx.addIssue({ code: 'custom', path: ['reynolds'], message: 'give either reynolds, or altitude_m with mach and referenceLength_m, not both' });
      }
      return;
    }
    if (flow.altitude_m === undefined) {
      ctx.addIssue({ code: 'custom', path: ['reynolds'], message: 'missing: give reynolds, or altitude_m with mach and referenceLength_m' });
    } else if (flow.referenceLength_m === undefined) {
      ctx.addIssue({ code: 'custom', path: ['referenceLength_m'], message: 'missing: altitude_m needs referenceLength_m (and mach) to give a Reynolds number' });
    } else if (!(mach > 0)) {
      ctx.addIssue({ code: 'custom', path: ['mach'], message: 'must be greater than zero when the Reynolds number comes from altitude_m (Re <= 0 otherwise)' });
    }
  });

/**
 * An array of finite numbers. Checked in one plain loop rather than element by element through zod,
 * because a case may carry 10^5 stations per surface and validation is part of every analysis; the
 * first bad element is reported with its index, e.g. `surfaces[0].s[12]`.
 */
const stationArray = (minimum = 0) =>
  z
    .custom<number[]>((value) => Array.isArray(value), { error: 'must be an array of numbers' })
    .superRefine((values, ctx) => {
      if (values.length > ENGINE_LIMITS.maxStationsPerSurface) {
        ctx.addIssue({ code: 'custom', message: `more than ${ENGINE_LIMITS.maxStationsPerSurface} stations (limit)` });
        return;
      }
      if (values.length < minimum) {
        ctx.addIssue({ code: 'custom', message: `needs at least ${minimum} stations` });
        return;
      }
      for (let i = 0; i < values.length; i++) {
        const value: unknown = values[i];
        if (typeof value !== 'number' || !Number.isFinite(value)) {
          ctx.addIssue({ code: 'custom', path: [i], message: 'must be a number' });
          return;
        }
      }
    });

const surfaceSchema = z
  .strictObject({
    name: z.string().trim().min(1, { error: 'name must not be empty' }).max(64),
    /** Arc length from the attachment line, strictly increasing. */
    s: stationArray(3),
    /** Ue / V∞ (one of ue or cp); with sweep, the chordwise component (normal to the leading edge). */
    ue: stationArray().optional(),
    /**
     * Pressure coefficient on the free stream, converted to Ue / V∞ with the free-stream Mach number and,
     * with sweep, simple sweep theory (one of ue or cp).
     */
    cp: stationArray().optional(),
    /** Body radius; present means axisymmetric (Mangler transformation). */
    r: stationArray().optional(),
    /** Forced transition at this arc length. */
    trip: z.number().optional(),
  })
  .superRefine((surface, ctx) => {
    const n = surface.s.length;
    if ((surface.ue === undefined) === (surface.cp === undefined)) {
      ctx.addIssue({ code: 'custom', path: ['ue'], message: 'give exactly one of ue or cp' });
      return;
    }
    for (const key of ['ue', 'cp', 'r'] as const) {
      const values = surface[key];
      if (values !== undefined && values.length !== n) {
        ctx.addIssue({ code: 'custom', path: [key], message: `has ${values.length} values but s has ${n}` });
        return;
      }
    }
    const s = surface.s;
    if (s[0] < 0) {
      ctx.addIssue({ code: 'custom', path: ['s', 0], message: `arc length must not be negative (${s[0]})` });
      return;
    }
    for (let i = 1; i < n; i++) {
      if (!(s[i] > s[i - 1])) {
        ctx.addIssue({ code: 'custom', path: ['s', i], message: `s must increase (${s[i]} after ${s[i - 1]})` });
        return;
      }
    }
    const ue = surface.ue;
    if (ue !== undefined) {
      // Zero is allowed after the first station for a rear stagnation point; the engine accepts it on
      // the rear half of the surface only.
      for (let i = 0; i < n; i++) {
        if (!(ue[i] >= 0)) {
          ctx.addIssue({ code: 'custom', path: ['ue', i], message: `Ue/V∞ must not be negative (${ue[i]})` });
          return;
        }
      }
    }
    const r = surface.r;
    if (r !== undefined) {
      for (let i = 0; i < n; i++) {
        if (r[i] < 0 || (i > 0 && r[i] === 0)) {
          ctx.addIssue({ code: 'custom', path: ['r', i], message: `body radius must be positive (zero allowed only at the first station), got ${r[i]}` });
          return;
        }
      }
    }
    if (surface.trip !== undefined && (surface.trip < s[0] || surface.trip > s[n - 1])) {
      ctx.addIssue({ code: 'custom', path: ['trip'], message: `s = ${surface.trip} is outside the surface (${s[0]} to ${s[n - 1]})` });
    }
  });

export const engineCaseSchema = z
  .strictObject({
    flow: flowSchema,
    surfaces: z.array(surfaceSchema).max(ENGINE_LIMITS.maxSurfaces, { error: `more than ${ENGINE_LIMITS.maxSurfaces} surfaces (limit)` }).optional(),
    /** Closed-loop `x [y] cp` table from the trailing edge over one side to the other. */
    pressureTable: z.string().max(ENGINE_LIMITS.maxTableCharacters, { error: `longer than ${ENGINE_LIMITS.maxTableCharacters} characters (limit)` }).optional(),
    /** ... or a section's shape: the engine's panel method gives its Cp (section.ts). */
    section: sectionSpecSchema.optional(),
    /** ... or a body of revolution's meridian, at zero incidence. */
    body: bodySpecSchema.optional(),
    criteria: z.array(z.enum(TRANSITION_CRITERIA)).default([...TRANSITION_CRITERIA]),
    /**
     * Which criterion sets the governing transition: one of the chosen criteria, or `earliest` (the
     * shortest laminar run any of them predicts). Absent: the earlier of e^N and crossflow (those of
     * them chosen) when e^N is chosen, else the earliest.
     */
    governing: z.enum(['earliest', ...TRANSITION_CRITERIA]).optional(),
    /**
     * Leading-edge sweep in degrees: the section is marched as part of an infinite swept wing (simple
     * sweep theory, crossflow) and the attachment line is checked.
     */
    sweepDeg: z.number().gt(-90, { error: 'sweepDeg must lie between -90 and 90' }).lt(90, { error: 'sweepDeg must lie between -90 and 90' }).default(0),
    /** Leading-edge radius normal to the leading edge (divided by L), for the attachment-line check. */
    leadingEdgeRadius: positive().optional(),
    /** March the turbulent boundary layer (Head) after transition; false stops at transition. */
    turbulent: z.boolean().default(true),
    /**
     * Smoothing of Ue(s) before it is differentiated (local least-squares quadratic over 2h + 1
     * stations): `off` (h = 1, the parabola through each station and its neighbours), `auto` (h from the
     * estimated scatter; 2 for clean computed data), or the half-width h itself.
     */
    smoothing: z
      .union([z.enum(['off', 'auto']), z.number().int({ error: 'smoothing half-width must be a whole number' }).min(1, { error: 'smoothing half-width must be at least 1' }).max(50, { error: 'smoothing half-width must be at most 50' })])
      .default('auto'),
  })
  .superRefine((engineCase, ctx) => {
    const hasSurfaces = engineCase.surfaces !== undefined && engineCase.surfaces.length > 0;
    const hasTable = engineCase.pressureTable !== undefined && engineCase.pressureTable.trim() !== '';
    if (engineCase.governing && engineCase.governing !== 'earliest' && !engineCase.criteria.includes(engineCase.governing)) {
      ctx.addIssue({ code: 'custom', path: ['governing'], message: `governing criterion "${engineCase.governing}" is not among the chosen criteria` });
    }
    const hasShape = engineCase.section !== undefined || engineCase.body !== undefined;
    if (hasShape) {
      const given = [hasSurfaces && 'surfaces', hasTable && 'pressureTable', engineCase.section && 'section', engineCase.body && 'body'].filter(Boolean);
      if (given.length > 1) ctx.addIssue({ code: 'custom', path: [String(given[1])], message: `give one of surfaces, pressureTable, section or body, not ${given.join(' and ')}` });
    } else if (!hasSurfaces && !hasTable) {
      ctx.addIssue({ code: 'custom', path: ['surfaces'], message: 'nothing to analyse: give surfaces, a pressureTable, a section or a body' });
    } else if (hasSurfaces && hasTable) {
      ctx.addIssue({ code: 'custom', path: ['pressureTable'], message: 'give either surfaces or a pressureTable, not both' });
    } else if (hasSurfaces) {
      const seen = new Set<string>();
      engineCase.surfaces!.forEach((surface, i) => {
        if (seen.has(surface.name)) ctx.addIssue({ code: 'custom', path: ['surfaces', i, 'name'], message: `surface name "${surface.name}" is used twice` });
        seen.add(surface.name);
      });
    }
  });

/** A validated case, defaults applied. */
export type EngineCase = z.infer<typeof engineCaseSchema>;
/** A case as a client writes it (defaults may be left out). */
export type EngineCaseInput = z.input<typeof engineCaseSchema>;

/** Why a chosen criterion has no location. */
export const CRITERION_MISSING_REASONS = ['notReached', 'afterLaminarSeparation', 'noSweep'] as const;
export type CriterionMissingReason = (typeof CRITERION_MISSING_REASONS)[number];

/**
 * One criterion's answer: a location on the laminar solution (which runs on past the governing
 * transition), or no location with the reason: `notReached` (the laminar layer reaches the end of the
 * surface first), `afterLaminarSeparation` (it separates first), `noSweep` (a crossflow criterion on an
 * unswept section). null only in results of engines before 1.2.0.
 */
const criterionResultSchema = z
  .union([
    z.object({
      s: z.number(),
      /** Momentum-thickness Reynolds number Ue θ / ν (local ν) at the predicted location. */
      reTheta: z.number(),
      /** Ue s / ν at the predicted location. */
      reS: z.number(),
      /** Crossflow Reynolds number there (crossflow). */
      reCf: z.number().optional(),
      /** Crossflow displacement-thickness Reynolds number there (crossflowC1). */
      reDelta2: z.number().optional(),
    }),
    z.object({ s: z.null(), reason: z.enum(CRITERION_MISSING_REASONS) }),
  ])
  .nullable();

const nullableStations = z.array(z.number().nullable());

const surfaceResultSchema = z.object({
  name: z.string(),
  stations: z.object({
    s: z.array(z.number()),
    /** Chordwise coordinate, where the input gave one (pressure tables). */
    x: z.array(z.number()).optional(),
    ue: z.array(z.number()),
    /** null where the boundary layer was not computed (after turbulent separation, or turbulent: false). */
    theta: nullableStations,
    deltaStar: nullableStations,
    H: nullableStations,
    /** Skin friction τw / (½ ρ Ue²) on the local edge velocity; null where undefined (Ue = 0, θ = 0). */
    cf: nullableStations,
    /**
     * Envelope N-factor of the laminar solution; it runs on past the governing transition to where N
     * reaches N_crit (so the curve meets N_crit at the e^N location), null after that.
     */
    n: nullableStations,
    /**
     * Owen–Randall crossflow Reynolds number of the laminar solution (swept sections), run on like n to
     * the crossflow location; null where not computed (no sweep, engines before 1.2.0).
     */
    reCf: nullableStations.optional(),
    /**
     * Local unit Reynolds number over the free stream's (ρe μ∞ / ρ∞ μe) at each station, which the
     * compressible laminar layer and the criteria use (Re_θ = Re∞ · ratio · Ue θ); only when M > 0
     * (engines from 1.2.5): absent, the ratio is 1.
     */
    reynoldsRatio: z.array(z.number()).optional(),
  }),
  transition: z.object({
    s: z.number().nullable(),
    by: z.enum(TRANSITION_CAUSES).nullable(),
    criteria: z.object({
      eN: criterionResultSchema.optional(),
      michel: criterionResultSchema.optional(),
      hRx: criterionResultSchema.optional(),
      granville: criterionResultSchema.optional(),
      crossflow: criterionResultSchema.optional(),
      crossflowC1: criterionResultSchema.optional(),
    }),
    /** Where the laminar solution, marched on, separates (null: it stays attached to the end). */
    laminarSeparationS: z.number().nullable().optional(),
  }),
  laminarSeparation: z.object({ s: z.number() }).nullable(),
  turbulentSeparation: z.object({ s: z.number() }).nullable(),
  /** Profile drag of this surface (Squire–Young), on V∞ and L; null when it cannot be estimated. */
  cd: z.number().nullable(),
  /** Friction drag of this surface, ∫ τw ds / (½ ρ V∞² L). */
  cdFriction: z.number().nullable(),
  /** The smoothing the slope dUe/ds was taken with: half-width h and the estimated scatter of Ue/V∞. */
  smoothing: z.object({ halfWidth: z.number().int(), scatter: z.number() }).optional(),
});

export const ATTACHMENT_LINE_VERDICTS = ['laminar', 'contaminationRisk', 'unstable'] as const;

export const engineResultSchema = z.object({
  engineVersion: z.string(),
  flow: z.object({
    reynolds: z.number(),
    mach: z.number(),
    nCrit: z.number(),
    nCritFrom: z.enum(['given', 'turbulenceIntensity', 'default']),
    /** Leading-edge sweep the layer was marched with (engines from 1.2.0). */
    sweepDeg: z.number().optional(),
    /** Whether the laminar layer was computed compressible (M∞ > 0; engines from 1.2.0). */
    compressibleLaminar: z.boolean().optional(),
    /** Free-stream static temperature taken for Sutherland's law in the compressible layer. */
    temperature_K: z.number().optional(),
    /** Critical Owen–Randall crossflow Reynolds number the crossflow criterion used (swept sections). */
    crossflowCritical: z.number().optional(),
  }),
  surfaces: z.array(surfaceResultSchema),
  /** The panel method's solution, when the case gave a section or a body. */
  inviscid: inviscidResultSchema.optional(),
  cd: z.number().nullable(),
  attachmentLine: z
    .object({
      reBar: z.number(),
      verdict: z.enum(ATTACHMENT_LINE_VERDICTS),
      from: z.enum(['velocityGradient', 'leadingEdgeRadius']),
    })
    .nullable(),
  warnings: z.array(z.string()),
});

export type EngineResult = z.infer<typeof engineResultSchema>;
export type EngineSurfaceResult = z.infer<typeof surfaceResultSchema>;
export type AttachmentLineVerdict = (typeof ATTACHMENT_LINE_VERDICTS)[number];

/** One criterion's entry in a surface result. */
export type CriterionResult = z.infer<typeof criterionResultSchema>;
/** An entry with a location. */
export type LocatedCriterion = Extract<NonNullable<CriterionResult>, { s: number }>;

/** The entry when it has a location, else null (no location, a reason, or not evaluated). */
export function locatedCriterion(entry: CriterionResult | undefined): LocatedCriterion | null {
  return entry != null && entry.s !== null ? (entry as LocatedCriterion) : null;
}
