/**
 * Panel-method benchmark: median wall time of one 160-panel section solution (NACA 2412 from its
 * designation: generate, factorise the vortex-panel system, solve at one incidence) and of a 30-point
 * incidence polar with the boundary layer and transition at each point (the polar cell's computation),
 * and one 120-panel body of revolution.
 *
 *   npx tsx libs/aero/bench/panel.bench.ts
 */
import { computePolarPoints } from '../src/polar';
import { bodyAt, prepareSection, sectionAt } from '../src/section-case';

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : 0.5 * (sorted[mid - 1] + sorted[mid]);
}

function time(runs: number, work: () => void): number {
  for (let i = 0; i < Math.max(3, runs / 5); i++) work();
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const start = performance.now();
    work();
    times.push(performance.now() - start);
  }
  return median(times);
}

const one = time(40, () => {
  sectionAt(prepareSection({ naca: '2412', panels: 160 }), { alphaDeg: 4 }, 0);
});
const polar = time(8, () => {
  computePolarPoints(prepareSection({ naca: '2412', panels: 160 }), { by: 'alpha', from: -4, to: 10, points: 30 }, { reynolds: 6e6, mach: 0, nCrit: 9 });
});
const sphere = Array.from({ length: 61 }, (_, k) => {
  const t = Math.PI - (Math.PI * k) / 60;
  return `${(1 + Math.cos(t)).toFixed(6)} ${k === 0 || k === 60 ? 0 : Math.sin(t).toFixed(6)}`;
}).join('\n');
const body = time(10, () => {
  bodyAt({ coordinates: sphere, panels: 120 });
});
console.log('panel methods (median wall time)');
console.log(`  one 160-panel section solution (NACA 2412, one incidence): ${one.toFixed(1)} ms`);
console.log(`  30-point polar, 160 panels, boundary layer and transition at each point: ${polar.toFixed(0)} ms (${(polar / 30).toFixed(1)} ms a point)`);
console.log(`  one 120-panel body of revolution (sphere): ${body.toFixed(1)} ms`);
