import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { engineResultSchema } from '@laminote/contracts';
import { describe, expect, it } from 'vitest';

const root = fileURLToPath(new URL('../../..', import.meta.url));
const tsx = join(root, 'node_modules', '.bin', 'tsx');
const cli = join(root, 'libs', 'aero', 'src', 'cli.ts');

function run(args: string[], input?: string | Buffer) {
  const result = spawnSync(tsx, [cli, ...args], { cwd: root, input, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024, timeout: 60_000 });
  return { status: result.status, stdout: result.stdout, stderr: result.stderr };
}

const s = Array.from({ length: 41 }, (_, i) => (i / 40) ** 2);
const goodCase = { flow: { reynolds: 5e6 }, surfaces: [{ name: 'upper', s, ue: s.map((x) => Math.min(1.1, 25 * x)) }] };

function expectRefusal(result: ReturnType<typeof run>, pattern: RegExp) {
  expect(result.status).toBe(2);
  expect(result.stdout).toBe('');
  const lines = result.stderr.split('\n').filter((l) => l !== '');
  expect(lines).toHaveLength(1);
  expect(lines[0]).toMatch(pattern);
  expect(result.stderr).not.toMatch(/\bat .*\.(ts|js):\d+/);
}

describe('aero command line', { timeout: 60_000 }, () => {
  it('analyses a case file: JSON on stdout, exit 0', () => {
    const dir = mkdtempSync(join(tmpdir(), 'aero-cli-'));
    const path = join(dir, 'case.json');
    writeFileSync(path, JSON.stringify(goodCase));
    const result = run(['analyze', path]);
    expect(result.status).toBe(0);
    expect(result.stderr).toBe('');
    expect(engineResultSchema.safeParse(JSON.parse(result.stdout)).success).toBe(true);
  });

  it('reads standard input with -', () => {
    const result = run(['analyze', '-'], JSON.stringify(goodCase));
    expect(result.status).toBe(0);
    expect(JSON.parse(result.stdout).surfaces[0].name).toBe('upper');
  });

  const bad: [string, string, RegExp][] = [
    ['malformed JSON', '{"flow": {"reynolds": 1e6,}', /^standard input: malformed JSON at line 1, column \d+/],
    ['arrays of different lengths', JSON.stringify({ flow: { reynolds: 1e6 }, surfaces: [{ name: 'u', s: [0, 0.5, 1], ue: [0, 1] }] }), /^surfaces\[0\]\.ue: has 2 values but s has 3$/],
    ['a non-number', JSON.stringify({ flow: { reynolds: 1e6 }, surfaces: [{ name: 'u', s: [0, 0.5, 'one'], ue: [0, 1, 1] }] }), /^surfaces\[0\]\.s\[2\]: must be a number$/],
    ['s not increasing', JSON.stringify({ flow: { reynolds: 1e6 }, surfaces: [{ name: 'u', s: [0, 0.5, 0.4], ue: [0, 1, 1] }] }), /^surfaces\[0\]\.s\[2\]: s must increase/],
    ['Re <= 0', JSON.stringify({ flow: { reynolds: -3 }, surfaces: goodCase.surfaces }), /^flow\.reynolds: must be greater than zero$/],
    ['a supersonic free stream', JSON.stringify({ flow: { reynolds: 1e6, mach: 1.2 }, surfaces: goodCase.surfaces }), /^flow\.mach: supersonic free stream/],
    ['a table row that is not numbers', JSON.stringify({ flow: { reynolds: 1e6 }, pressureTable: 'x y cp\n1 0 0.1\n0.5 0.05 -0.3\n0 0 1\n0.5 -0.05 n/a\n1 0 0.1' }), /^pressureTable line 5: "n\/a" is not a number \(cp\)$/],
    ['nothing to analyse', JSON.stringify({ flow: { reynolds: 1e6 } }), /^surfaces: nothing to analyse/],
    ['empty input', '', /nothing to analyse/],
  ];
  for (const [label, input, pattern] of bad) {
    it(`refuses ${label} with exit 2 and one line`, () => expectRefusal(run(['analyze', '-'], input), pattern));
  }

  it('refuses input over the 32 MiB limit', () => {
    expectRefusal(run(['analyze', '-'], Buffer.alloc(33 * 1024 * 1024, 0x20)), /larger than the 32 MiB limit/);
  });

  it('refuses a missing file and a wrong command', () => {
    expectRefusal(run(['analyze', join(tmpdir(), 'no-such-case.json')]), /no-such-case\.json: cannot read \(ENOENT\)/);
    expectRefusal(run(['solve', 'x.json']), /^usage: aero analyze/);
  });
});
