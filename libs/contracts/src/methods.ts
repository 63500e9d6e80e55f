import { z } from 'zod';

/** The validation page's answer: every shared reference case, run on the server (GET /api/methods/validation). */
export const toleranceSchema = z.object({ kind: z.enum(['relative', 'absolute']), value: z.number() });

export const validationCaseResultSchema = z.object({
  id: z.string(),
  title: z.string(),
  quantity: z.string(),
  source: z.string(),
  tolerance: toleranceSchema,
  reference: z.number().nullable(),
  /** The engine's value; null when it could not be computed (then the case fails). */
  value: z.number().nullable(),
  error: z.number().nullable(),
  pass: z.boolean(),
});

export const validationSuiteResultSchema = z.object({
  id: z.string(),
  title: z.string(),
  methods: z.array(z.string()),
  summary: z.string(),
  cases: z.array(validationCaseResultSchema),
});

export const validationReportSchema = z.object({
  engineVersion: z.string(),
  /** When the cases were run (they are run once per server process: the engine cannot change while it runs). */
  ranAt: z.string(),
  durationMs: z.number(),
  passed: z.number().int(),
  total: z.number().int(),
  suites: z.array(validationSuiteResultSchema),
});

export type ValidationCaseResultDto = z.infer<typeof validationCaseResultSchema>;
export type ValidationSuiteResultDto = z.infer<typeof validationSuiteResultSchema>;
export type ValidationReport = z.infer<typeof validationReportSchema>;
