/**
 * Engine benchmark: `npm run bench -- engine`.
 *
 * 1. Against C. `../shared/bench/ref_march.c` is the same core work (Thwaites, Michel and envelope e^N,
 *    Head's march, Squire–Young) in plain C. The bench builds it with the system C compiler at -O2 into
 *    a scratch folder outside git, then times it and `analyzeCase` alternately, several rounds each, on
 *    the surface shape of its `main()` (both surfaces the same, Re 6e6, N_crit 9, transition at the
 *    earliest of e^N and Michel or laminar separation), so both see the same machine load. The engine's
 *    time is the whole entry point: validation of the case, preparation, the marches and the result
 *    arrays. Targets (issue 15): at most 2.5× the C time at 2 × 300 stations, 2× at 2 × 10 000.
 * 2. The NLF-like two-surface case with all four criteria at 300, 1 000 and 10 000 stations, for the
 *    growth with station count (target of issue 4: under 1 ms at 2 × 300).
 *
 *   npx tsx libs/aero/bench/engine.bench.ts
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { EngineCaseInput } from '@laminote/contracts';
import { analyzeCase } from '../src/analyze';

const out = (line: string) => process.stdout.write(`${line}\n`);

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid]! : 0.5 * (sorted[mid - 1]! + sorted[mid]!);
}

// ── 1. The engine against ref_march.c ───────────────────────────────────────────────────────────

const REF_SOURCE = path.resolve(import.meta.dirname, '../../../../shared/bench/ref_march.c');

/** Builds ref_march.c into a scratch folder outside the work tree; null when no compiler is found. */
function buildReference(): string | null {
  if (!existsSync(REF_SOURCE)) return null;
  const dir = path.join(tmpdir(), 'laminote-bench');
  mkdirSync(dir, { recursive: true });
  const binary = path.join(dir, 'ref_march');
  if (existsSync(binary) && statSync(binary).mtimeMs > statSync(REF_SOURCE).mtimeMs) return binary;
  for (const compiler of ['gcc', 'cc']) {
    const r = spawnSync(compiler, ['-O2', '-o', binary, REF_SOURCE, '-lm'], { encoding: 'utf8' });
    if (r.status === 0) return binary;
  }
  return null;
}

/** Median microseconds per two-surface analysis from one run of the C program. */
function referenceMicroseconds(binary: string, stations: number, repeats: number): number {
  const r = spawnSync(binary, [String(stations), String(repeats)], { encoding: 'utf8' });
  const m = /median_us=([\d.]+)/.exec(r.stdout);
  if (r.status !== 0 || !m) throw new Error(`ref_march failed: ${r.stderr || r.stdout}`);
  return Number(m[1]);
}

/** The surface of ref_march.c's main(): stagnation start, acceleration, then recovery past 60 %. */
function referenceCase(stations: number): EngineCaseInput {
  const s: number[] = [];
  const ue: number[] = [];
  for (let i = 0; i < stations; i++) {
    const x = i / (stations - 1);
    s.push(x);
    ue.push(x < 0.02 ? (1.2 * x) / 0.02 : 1.2 + 0.1 * (x - 0.02) - (x > 0.6 ? 0.5 * (x - 0.6) : 0));
  }
  return {
    flow: { reynolds: 6e6, nCrit: 9 },
    criteria: ['eN', 'michel'],
    governing: 'earliest',
    surfaces: [
      { name: 'upper', s, ue },
      { name: 'lower', s: [...s], ue: [...ue] },
    ],
  };
}

/** Median microseconds of `analyzeCase` over `repeats` calls (after a short warm-up). */
function engineMicroseconds(engineCase: EngineCaseInput, repeats: number): number {
  for (let i = 0; i < Math.max(5, repeats / 10); i++) analyzeCase(engineCase);
  const times: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const t0 = performance.now();
    analyzeCase(engineCase);
    times.push((performance.now() - t0) * 1000);
  }
  return median(times);
}

function againstC(): void {
  const binary = buildReference();
  out('engine against ref_march.c (same surface shape, alternating, median of each round; ratio of the medians of the rounds)');
  if (binary === null) {
    out('  no C compiler (gcc or cc) or no ../shared/bench/ref_march.c: not measured');
    return;
  }
  const rows = [
    { stations: 300, repeats: 600, rounds: 9, target: 2.5 },
    { stations: 10000, repeats: 20, rounds: 7, target: 2 },
  ];
  for (const row of rows) {
    const engineCase = referenceCase(row.stations);
    const check = analyzeCase(engineCase);
    for (const surface of check.surfaces) {
      if (surface.transition.s === null || surface.turbulentSeparation !== null) throw new Error('the reference case should transition and stay attached');
    }
    const c: number[] = [];
    const engine: number[] = [];
    for (let round = 0; round < row.rounds; round++) {
      c.push(referenceMicroseconds(binary, row.stations, row.repeats));
      engine.push(engineMicroseconds(engineCase, row.repeats));
    }
    const ratio = median(engine) / median(c);
    out(
      `  2 × ${String(row.stations).padStart(5)} stations: engine ${(median(engine) / 1000).toFixed(3)} ms, C ${(median(c) / 1000).toFixed(3)} ms: ` +
        `${ratio.toFixed(2)}× (target ≤ ${row.target}×: ${ratio <= row.target ? 'met' : 'NOT met'}; rounds ${engine.map((e, i) => (e / c[i]!).toFixed(2)).join(' ')})`,
    );
  }
}

// ── 2. The NLF-like case at growing station counts ──────────────────────────────────────────────

/** An NLF-like pair of surfaces: favourable gradient to about 45 % chord, then recovery. */
function twoSurfaceCase(stationsPerSurface: number): EngineCaseInput {
  const s = Array.from({ length: stationsPerSurface }, (_, i) => 1.02 * (i / (stationsPerSurface - 1)) ** 1.6);
  const shape = (x: number, peak: number) => peak * Math.tanh(60 * x) * (1 + 0.25 * x - 0.55 * Math.max(0, x - 0.45) ** 1.3 - 0.1 * x * x);
  return {
    flow: { reynolds: 1.2e7, mach: 0 },
    criteria: ['eN', 'michel', 'hRx', 'granville'],
    sweepDeg: 20,
    surfaces: [
      { name: 'upper', s, ue: s.map((x) => shape(x, 1.18)) },
      { name: 'lower', s, ue: s.map((x) => shape(x, 1.06)) },
    ],
  };
}

function measure(stationsPerSurface: number, runs: number): number {
  const engineCase = twoSurfaceCase(stationsPerSurface);
  const check = analyzeCase(engineCase);
  for (const surface of check.surfaces) {
    if (surface.transition.s === null || surface.turbulentSeparation !== null) throw new Error('the bench case should transition and stay attached');
  }
  return engineMicroseconds(engineCase, runs) / 1000;
}

againstC();
out('');
const rows: [number, number][] = [
  [300, 1000],
  [1000, 300],
  [10000, 40],
];
const base = measure(300, 1000);
out('engine: one NLF-like two-surface analysis, all four criteria, turbulent march (median wall time)');
for (const [stations, runs] of rows) {
  const ms = stations === 300 ? base : measure(stations, runs);
  const note = stations === 300 ? (ms < 1 ? '  target < 1 ms: met' : '  target < 1 ms: MISSED') : `  ${(ms / base).toFixed(1)}× the 300-station time for ${(stations / 300).toFixed(1)}× the stations`;
  out(`  2 × ${String(stations).padStart(5)} stations: ${ms.toFixed(3)} ms${note}`);
}
