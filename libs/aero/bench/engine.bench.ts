/**
 * Engine benchmark: median wall time of one two-surface analysis (schema validation, laminar march,
 * all four transition criteria, Head's turbulent march, drag) at 300, 1 000 and 10 000 stations per
 * surface. Target: under 1 ms at 2 × 300 stations; the cost should grow about linearly.
 *
 *   npx tsx libs/aero/bench/engine.bench.ts
 */
import type { EngineCaseInput } from '@laminote/contracts';
import { analyzeCase } from '../src/analyze';

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

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : 0.5 * (sorted[mid - 1] + sorted[mid]);
}

function measure(stationsPerSurface: number, runs: number): number {
  const engineCase = twoSurfaceCase(stationsPerSurface);
  const check = analyzeCase(engineCase);
  for (const surface of check.surfaces) {
    if (surface.transition.s === null || surface.turbulentSeparation !== null) throw new Error('the bench case should transition and stay attached');
  }
  for (let i = 0; i < Math.max(20, runs / 5); i++) analyzeCase(engineCase);
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const start = performance.now();
    analyzeCase(engineCase);
    times.push(performance.now() - start);
  }
  return median(times);
}

const rows: [number, number][] = [
  [300, 1000],
  [1000, 300],
  [10000, 40],
];
const base = measure(300, 1000);
console.log('engine: one two-surface analysis, all criteria, turbulent march (median wall time)');
for (const [stations, runs] of rows) {
  const ms = stations === 300 ? base : measure(stations, runs);
  const note = stations === 300 ? (ms < 1 ? '  target < 1 ms: met' : '  target < 1 ms: MISSED') : `  ${(ms / base).toFixed(1)}× the 300-station time for ${(stations / 300).toFixed(1)}× the stations`;
  console.log(`  2 × ${String(stations).padStart(5)} stations: ${ms.toFixed(3)} ms${note}`);
}
