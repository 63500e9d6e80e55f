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

  describe('study', () => {
    const ids = { flow: '10000000-0000-4000-8000-000000000001', pressure: '10000000-0000-4000-8000-000000000002', analysis: '10000000-0000-4000-8000-000000000003', note: '10000000-0000-4000-8000-000000000004' };
    const plate = ['x cp', ...Array.from({ length: 101 }, (_, i) => `${i / 100} 0`)].join('\n');
    const document: { cells: { cellId: string; kind: string; title: string; inputs: Record<string, unknown>; output: null }[] } & Record<string, unknown> = {
      format: 'laminote.study/1',
      study: { id: 's', title: 'Plate' },
      source: { kind: 'draft', branchId: null, branchName: 'main', versionId: null, versionNumber: null },
      exportedAt: '2026-01-01T00:00:00.000Z',
      engineVersion: '0',
      caution: '',
      // Listed against the run order: the analysis first, the cells it uses after it.
      cells: [
        { cellId: ids.analysis, kind: 'analysis', title: 'Analysis', inputs: { flowCellId: ids.flow, pressureCellId: ids.pressure, criteria: ['michel'], turbulent: false }, output: null },
        { cellId: ids.note, kind: 'note', title: 'Note', inputs: { markdown: 'invented' }, output: null },
        { cellId: ids.flow, kind: 'flow', title: 'Flow', inputs: { mode: 'reynolds', reynolds: 1e6, mach: 0 }, output: null },
        { cellId: ids.pressure, kind: 'pressure', title: 'Plate', inputs: { text: plate, layout: 'surface' }, output: null },
      ],
    };

    it('computes every cell in dependency order and prints the document with its outputs', () => {
      const result = run(['study', '-'], JSON.stringify(document));
      expect(result.stderr).toBe('');
      expect(result.status).toBe(0);
      const out = JSON.parse(result.stdout);
      expect(out.cells.map((c: { cellId: string }) => c.cellId)).toEqual(document.cells.map((c) => c.cellId));
      const [analysis, note, flow] = out.cells;
      expect(note.output).toBeNull();
      expect(flow.output).toMatchObject({ status: 'ok', result: { reynolds: 1e6, nCrit: 9 } });
      expect(analysis.output.status).toBe('ok');
      // Thwaites (1949) on a flat plate: θ = 0.6708 s / √Re_s; at s = 0.5, Re_s = 5e5.
      const st = analysis.output.result.surfaces[0].stations;
      const i = st.s.indexOf(0.5);
      expect(st.theta[i] / ((0.6708 * 0.5) / Math.sqrt(5e5))).toBeCloseTo(1, 2);
    });

    it('keeps a cell whose inputs have problems out of the run, names them, and fails the cells that use it', () => {
      const broken = structuredClone(document);
      broken.cells[2]!.inputs = { mode: 'reynolds', mach: 0 };
      const out = JSON.parse(run(['study', '-'], JSON.stringify(broken)).stdout);
      expect(out.cells[2].output).toBeNull();
      expect(out.cells[2].problems[0]).toMatchObject({ field: 'reynolds' });
      expect(out.cells[0].output).toBeNull();
      expect(out.cells[0].problems[0]).toMatchObject({ field: 'flowCellId', message: 'the flow condition it uses has problems to fix first' });
    });

    it('refuses what is not a study document, naming the field', () => {
      expectRefusal(run(['study', '-'], JSON.stringify(goodCase)), /^standard input: format: format must be "laminote\.study\/1"/);
      expectRefusal(run(['study', '-'], JSON.stringify({ ...document, cells: [{ kind: 'flow', inputs: {} }] })), /^standard input: cells\[0\]\.cellId: /);
    });
  });
});
