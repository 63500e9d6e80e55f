import type { SweepInputs } from './cell-schemas';

/**
 * Limits and states that screens show before anything is sent, in plain data. Zod-free on purpose, so
 * the web app's first screen reads them (`@laminote/contracts/limits`) without loading the schemas
 * that enforce them (`cell-schemas.ts`, `section.ts`, `review.ts`, `jobs.ts` re-export them from here).
 */

/** Largest pasted or uploaded table a pressure cell holds (characters), and largest uploaded file (bytes). */
export const PRESSURE_TEXT_LIMIT = 5_000_000;
export const UPLOAD_LIMIT_BYTES = 5 * 1024 * 1024;

/** What a sweep may vary over (the engine's own limits). */
export const SWEEP_RANGES: Record<SweepInputs['parameter'], { min: number; max: number; note: string }> = {
  reynolds: { min: 1e4, max: 1e10, note: '' },
  mach: { min: 0, max: 0.95, note: ' (subsonic free stream)' },
  nCrit: { min: 1, max: 20, note: '' },
  sweepDeg: { min: 0, max: 70, note: '°' },
};

/** Largest pasted coordinate text (characters) and the panel counts offered. */
export const SECTION_LIMITS = { maxCoordinateCharacters: 400_000, minPanels: 40, maxPanels: 400, maxPolarPoints: 61 } as const;

/** Longest comment body (characters). */
export const COMMENT_MAX_LENGTH = 20_000;

/** The states of a run's job. */
export const JOB_STATES = ['queued', 'running', 'completed', 'failed', 'cancelled'] as const;
export type JobState = (typeof JOB_STATES)[number];

/** Whether a job in this state may still change. */
export const jobIsActive = (state: JobState): boolean => state === 'queued' || state === 'running';
