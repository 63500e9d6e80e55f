import { type SweepComparison, type SweepResult, sweepResultSchema } from '@laminote/contracts';
import { CD_TOLERANCE, delta, type StoredOutput, transitionDelta } from './result-diff';

/**
 * A parameter sweep's results in two versions, step by step. Compared by what the sweep computed, not
 * by its inputs: a sweep whose own range is unchanged still moves when the analysis, flow or table it
 * re-runs changed, and that is what a reviewer needs to see.
 */

export type SweepSide = { state: 'absent' } | { state: 'notRun' } | { state: 'error'; message: string } | { state: 'ok'; result: SweepResult };

/** What a version holds for a sweep cell; a result that is not a sweep result counts as an error. */
export function sweepSideOf(present: boolean, output: StoredOutput | null): SweepSide {
  if (!present) return { state: 'absent' };
  if (!output) return { state: 'notRun' };
  if (output.status === 'error') return { state: 'error', message: output.error?.message ?? 'the run failed' };
  const parsed = sweepResultSchema.safeParse(output.result);
  return parsed.success ? { state: 'ok', result: parsed.data } : { state: 'error', message: 'the stored output is not a sweep result' };
}

type Step = SweepResult['steps'][number];

/** Swept values match when they agree to 1 part in 10⁹ (they are stored rounded). */
function sameValue(a: number, b: number): boolean {
  return Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));
}

function location(step: Step | undefined, name: string): { at: number | null; by: string | null; present: boolean } {
  const surface = step?.status === 'ok' ? step.surfaces.find((s) => s.name === name) : undefined;
  return { at: surface ? (surface.transitionX ?? surface.transitionS) : null, by: surface?.by ?? null, present: surface !== undefined };
}

export function compareSweep(cellId: string, title: string, sideA: SweepSide, sideB: SweepSide): SweepComparison {
  const a = sideA.state === 'ok' ? sideA.result : null;
  const b = sideB.state === 'ok' ? sideB.result : null;
  const values: number[] = [];
  for (const step of [...(a?.steps ?? []), ...(b?.steps ?? [])]) if (!values.some((v) => sameValue(v, step.value))) values.push(step.value);
  values.sort((x, y) => x - y);
  const names: string[] = [];
  for (const step of [...(a?.steps ?? []), ...(b?.steps ?? [])]) for (const s of step.surfaces) if (!names.includes(s.name)) names.push(s.name);
  const stepOf = (result: SweepResult | null, value: number) => result?.steps.find((s) => sameValue(s.value, value));
  const steps = values.map((value) => {
    const sa = stepOf(a, value);
    const sb = stepOf(b, value);
    return {
      value,
      cd: delta(sa?.status === 'ok' ? sa.cd : null, sb?.status === 'ok' ? sb.cd : null, CD_TOLERANCE, 'down'),
      surfaces: names.map((name) => {
        const la = location(sa, name);
        const lb = location(sb, name);
        const coordinate = (sa ?? sb)?.surfaces.find((s) => s.name === name)?.transitionX !== null ? 'x' : 's';
        return { name, transition: transitionDelta(la.at, lb.at, coordinate, la.by, lb.by, { a: la.present, b: lb.present }) };
      }),
    };
  });
  const resultsDiffer = steps.some((s) => s.cd.effect !== 'neutral' || s.surfaces.some((x) => x.transition.shift !== 'none' || x.transition.byA !== x.transition.byB));
  const status = (side: SweepSide) => side.state;
  const error = (side: SweepSide) => (side.state === 'error' ? side.message : null);
  return {
    cellId,
    title,
    parameter: a?.parameter ?? b?.parameter ?? null,
    statusA: status(sideA),
    statusB: status(sideB),
    errorA: error(sideA),
    errorB: error(sideB),
    resultsDiffer,
    steps,
  };
}
