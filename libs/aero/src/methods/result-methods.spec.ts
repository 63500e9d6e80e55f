import { TRANSITION_CRITERIA } from '@laminote/contracts';
import { describe, expect, it } from 'vitest';
import { METHODS, findMethod } from './index';
import { METHOD_NAMES, isMethodId } from './method-names';
import { CRITERION_METHODS, resultMethodIds, resultMethods } from './result-methods';

const ids = (kind: string, result: unknown) => resultMethods(kind, result).map((m) => m.id);

describe('resultMethods (the "Methods" links under each result)', () => {
  it('names every catalogued method from the names kept apart from the catalogue, and no other', () => {
    expect(METHODS.map((m) => m.id).sort()).toEqual(Object.keys(METHOD_NAMES).sort());
    for (const method of METHODS) expect(method.name, method.id).toBe(METHOD_NAMES[method.id as keyof typeof METHOD_NAMES]);
    expect(isMethodId('thwaites')).toBe(true);
    expect(isMethodId('toString')).toBe(false);
  });

  it('names a catalogued method for every transition criterion an analysis can evaluate', () => {
    for (const criterion of TRANSITION_CRITERIA) {
      expect(CRITERION_METHODS[criterion], criterion).toBeDefined();
      expect(findMethod(CRITERION_METHODS[criterion]!), criterion).toBeDefined();
    }
  });

  it('links an analysis to the laminar and turbulent layers, the drag and exactly the criteria it evaluated', () => {
    const result = {
      flow: { reynolds: 6e6, mach: 0, nCrit: 9 },
      surfaces: [{ transition: { criteria: { eN: 0.4, michel: 0.3 } } }, { transition: { criteria: { eN: null, michel: 0.5 } } }],
      attachmentLine: null,
    };
    expect(ids('analysis', result)).toEqual(['thwaites', 'head', 'squire-young', 'envelope-en', 'michel']);
  });

  it('adds the compressible laminar layer above M = 0, the crossflow methods on a swept wing and Poll for an attachment line', () => {
    const result = {
      flow: { reynolds: 2e7, mach: 0.7, nCrit: 9 },
      surfaces: [{ transition: { criteria: { eN: 0.4, crossflow: 0.1 } } }],
      attachmentLine: { reBar: 180, verdict: 'laminar' },
    };
    expect(ids('analysis', result)).toEqual(['thwaites', 'compressible-thwaites', 'head', 'squire-young', 'envelope-en', 'owen-randall', 'simple-sweep', 'falkner-skan-cooke', 'poll']);
  });

  it('links a section, a polar and an analysis of a section to the panel method and the compressibility correction', () => {
    expect(ids('section', { outline: { x: [], y: [] }, inviscid: {} })).toEqual(['vortex-panel', 'compressibility-correction']);
    const polar = { points: [{ surfaces: [{ criteria: { eN: 0.3, michel: 0.2 } }] }, { surfaces: [{ criteria: { eN: 0.35 } }] }] };
    expect(ids('polar', polar)).toEqual(['vortex-panel', 'compressibility-correction', 'thwaites', 'head', 'squire-young', 'envelope-en', 'michel']);
    const analysisOfSection = { flow: { mach: 0 }, inviscid: { cl: 0.5 }, surfaces: [{ transition: { criteria: { eN: 0.3 } } }] };
    expect(ids('analysis', analysisOfSection)).toEqual(['vortex-panel', 'compressibility-correction', 'thwaites', 'head', 'squire-young', 'envelope-en']);
  });

  it('links a body and an analysis of a body to the source-ring panel method, and the body’s layer to Mangler’s transformation', () => {
    expect(ids('body', { outline: { x: [], r: [] }, inviscid: { kind: 'body' } })).toEqual(['source-ring-panel']);
    const analysisOfBody = { flow: { mach: 0 }, inviscid: { kind: 'body' }, surfaces: [{ transition: { criteria: { eN: 0.3 } } }] };
    expect(ids('analysis', analysisOfBody)).toEqual(['source-ring-panel', 'thwaites', 'mangler', 'head', 'squire-young', 'envelope-en']);
  });

  it('links the other kinds to their own methods and nothing for a result it cannot read', () => {
    expect(ids('flow', { temperature_K: 223.15 })).toEqual(['isa', 'sutherland', 'mack']);
    expect(ids('flow', { temperature_K: null })).toEqual(['mack']);
    expect(ids('pressure', { layout: 'closedLoop' })).toEqual(['stagnation', 'isentropic']);
    expect(ids('flatPlate', {})).toEqual(['flat-plate']);
    expect(ids('leadingEdge', {})).toEqual(['poll']);
    expect(ids('analysis', null)).toEqual([]);
    expect(ids('note', { text: 'x' })).toEqual([]);
  });

  it('names by id, without the catalogue, exactly the methods it links (the notebook keeps their line while the catalogue loads)', () => {
    const results: [string, unknown][] = [
      ['flow', { temperature_K: 223.15 }],
      ['flow', { temperature_K: null }],
      ['pressure', { layout: 'closedLoop' }],
      ['pressure', { layout: 'surfaces' }],
      ['analysis', { flow: { mach: 0.7 }, surfaces: [{ transition: { criteria: { eN: 0.4, crossflowC1: 0.2, hRx: 0.3, granville: 0.3 } } }], attachmentLine: { reBar: 90 } }],
      ['sweep', {}],
      ['section', {}],
      ['body', {}],
      ['polar', { points: [{ surfaces: [{ criteria: { eN: 0.3 } }] }] }],
      ['flatPlate', {}],
      ['leadingEdge', {}],
      ['note', { text: 'x' }],
      ['comparison', {}],
      ['analysis', null],
    ];
    for (const [kind, result] of results) expect(resultMethodIds(kind, result), kind).toEqual(ids(kind, result));
  });
});
