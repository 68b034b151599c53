import { sampleDocument } from '../testing/catalogue-fixture';
import {
  addMode,
  clearOverride,
  deleteMode,
  documentForResults,
  findMode,
  forgetStage,
  hasTransmitMode,
  leftOutBy,
  modeIdFor,
  setBypass,
  setOverride,
  stageInMode,
  typedKey,
  updateMode,
} from './mode-edits';

describe('mode edits', () => {
  it('should give a new mode a unique slug id and leave the chain as written alone', () => {
    const first = addMode(sampleDocument(), 'Receive', 'receive');
    expect(first.id).toBe('receive');
    const second = addMode(first.doc, 'receive', 'state');
    expect(second.id).toBe('receive-2');
    expect(second.doc.modes!.map((m) => [m.id, m.kind])).toEqual([
      ['receive', 'receive'],
      ['receive-2', 'state'],
    ]);
    expect(second.doc.stages).toEqual(sampleDocument().stages);
    expect(modeIdFor('Band 2 — 7 MHz!', [])).toBe('band-2-7-mhz');
    expect(modeIdFor('***', [])).toBe('mode');
  });

  it('should rename a mode keeping its id, and drop the modes key with the last mode', () => {
    const { doc, id } = addMode(sampleDocument(), 'tx', 'transmit');
    const renamed = updateMode(doc, id, { name: '  Transmit ' });
    expect(findMode(renamed, id)).toEqual({ id: 'tx', name: 'Transmit', kind: 'transmit' });
    expect('modes' in deleteMode(renamed, id)).toBe(false);
  });

  it('should set and clear overrides without touching the chain values', () => {
    const { doc, id } = addMode(sampleDocument(), 'band 2', 'state');
    const set = setOverride(setOverride(doc, id, 'tank', 'c', 1e-9), id, 'amp', 'gain', 10);
    expect(findMode(set, id)!.values).toEqual({ tank: { c: 1e-9 }, amp: { gain: 10 } });
    expect(set.stages).toEqual(doc.stages);
    const cleared = clearOverride(clearOverride(set, id, 'tank', 'c'), id, 'amp', 'gain');
    // Nothing left: the mode carries no empty maps.
    expect(findMode(cleared, id)).toEqual({ id: 'band-2', name: 'band 2', kind: 'state' });
  });

  it('should show a stage with the mode values and the text typed for them', () => {
    const { doc, id } = addMode(sampleDocument(), 'b', 'state');
    const set = setOverride(doc, id, 'tank', 'c', 1e-9);
    const mode = findMode(set, id);
    const tank = set.stages[1];
    expect(stageInMode(tank, mode).values['c']).toBe(1e-9);
    const typed = new Map([[typedKey(id, 'tank', 'c'), { text: '1 nF', value: 1e-9 }]]);
    expect(stageInMode(tank, mode, typed).entered).toEqual({ c: '1 nF' });
    // After an undo the text may belong to another value: then the value is written out.
    const stale = new Map([[typedKey(id, 'tank', 'c'), { text: '2 nF', value: 2e-9 }]]);
    expect(stageInMode(tank, mode, stale).entered).toBeUndefined();
    expect(stageInMode(tank, null)).toBe(tank);
  });

  it('should leave stages out, put them back, and read what a path leaves out', () => {
    const { doc, id } = addMode(sampleDocument(), 'no amp', 'state');
    const out = setBypass(doc, id, 'amp', true);
    expect(leftOutBy(findMode(out, id), 'amp')).toBe('bypass');
    expect(leftOutBy(findMode(out, id), 'tank')).toBeNull();
    expect(findMode(setBypass(out, id, 'amp', false), id)!.bypass).toBeUndefined();
    const pathMode = {
      id: 'p',
      name: 'p',
      kind: 'transmit' as const,
      path: ['src', 'amp', 'load'],
    };
    expect(leftOutBy(pathMode, 'tank')).toBe('path');
  });

  it('should take a stage off a mode path and put it back in chain order', () => {
    let { doc } = addMode(sampleDocument(), 'p', 'transmit');
    doc = { ...doc, modes: [{ ...doc.modes![0], path: ['src', 'amp', 'load'] }] };
    const off = setBypass(doc, 'p', 'amp', true);
    expect(findMode(off, 'p')!.path).toEqual(['src', 'load']);
    expect(findMode(off, 'p')!.bypass).toBeUndefined();
    const back = setBypass(setBypass(off, 'p', 'tank', false), 'p', 'amp', false);
    expect(findMode(back, 'p')!.path).toEqual(['src', 'tank', 'amp', 'load']);
  });

  it('should forget a deleted stage in every mode', () => {
    let { doc } = addMode(sampleDocument(), 'a', 'state');
    doc = setBypass(setOverride(doc, 'a', 'amp', 'gain', 3), 'a', 'amp', true);
    doc = { ...doc, modes: [...doc.modes!, { id: 'p', name: 'p', kind: 'transmit', path: ['src', 'amp', 'load'] }] }; // prettier-ignore
    const forgotten = forgetStage(doc, 'amp');
    expect(findMode(forgotten, 'a')).toEqual({ id: 'a', name: 'a', kind: 'state' });
    expect(findMode(forgotten, 'p')!.path).toEqual(['src', 'load']);
  });

  it('should read results against the mode stages in the path order, with its values', () => {
    let { doc } = addMode(sampleDocument(), 'x', 'state');
    doc = setBypass(setOverride(doc, 'x', 'tank', 'c', 5e-10), 'x', 'amp', true);
    const view = documentForResults(doc, findMode(doc, 'x'));
    expect(view.stages.map((s) => s.id)).toEqual(['src', 'tank', 'load']);
    expect(view.stages[1].values['c']).toBe(5e-10);
    expect(view.modes).toBeUndefined();
    const path = { id: 'p', name: 'p', kind: 'transmit' as const, path: ['src', 'load'] };
    expect(documentForResults(doc, path).stages.map((s) => s.id)).toEqual(['src', 'load']);
  });

  it('should say whether a chain has a transmit mode', () => {
    expect(hasTransmitMode(sampleDocument())).toBe(false);
    expect(hasTransmitMode(addMode(sampleDocument(), 'rx', 'receive').doc)).toBe(false);
    expect(hasTransmitMode(addMode(sampleDocument(), 'tx', 'transmit').doc)).toBe(true);
  });
});
