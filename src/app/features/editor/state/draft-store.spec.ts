import { sampleDocument } from '../testing/catalogue-fixture';
import { clearDrafts, readDraft, writeDraft } from './draft-store';

describe('draft store', () => {
  beforeEach(() => localStorage.clear());

  it('should give back a written draft with its version', () => {
    writeDraft('c1', 3, { ...sampleDocument(), name: 'Edited' });
    const draft = readDraft('c1');
    expect(draft).toMatchObject({ chainId: 'c1', version: 3 });
    expect(draft?.document.name).toBe('Edited');
  });

  it('should keep drafts of different chains apart', () => {
    writeDraft('c1', 1, sampleDocument());
    expect(readDraft('c2')).toBeNull();
  });

  it('should ignore a stored draft that is not a valid chain document', () => {
    localStorage.setItem(
      'cw-draft:c1:1',
      JSON.stringify({ chainId: 'c1', version: 1, document: { name: '' } }),
    );
    localStorage.setItem('cw-draft:c1:2', '{not json');
    expect(readDraft('c1')).toBeNull();
  });

  it('should clear every draft of one chain only', () => {
    writeDraft('c1', 1, sampleDocument());
    writeDraft('c1', 2, sampleDocument());
    writeDraft('c2', 1, sampleDocument());
    clearDrafts('c1');
    expect(readDraft('c1')).toBeNull();
    expect(readDraft('c2')).not.toBeNull();
  });
});
