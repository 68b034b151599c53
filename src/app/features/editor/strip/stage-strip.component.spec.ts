import { signal } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import type { AnalysisResult, Flag } from '../../../../../shared/engine/types';
import { AnalysisRunner, type AnalysisRefusal } from '../state/analysis-runner';
import { EditFeedback } from '../state/edit-feedback';
import { EditorStore } from '../state/editor.store';
import { CATALOGUE } from '../testing/catalogue-fixture';
import { chainDto } from '../testing/chain-dto';
import { StageStripComponent } from './stage-strip.component';

describe('StageStripComponent', () => {
  let fixture: ComponentFixture<StageStripComponent>;
  let store: EditorStore;
  const result = signal<AnalysisResult | null>(null);
  const refusal = signal<AnalysisRefusal | null>(null);
  const report = jest.fn();

  beforeEach(async () => {
    result.set(null);
    refusal.set(null);
    report.mockReset();
    TestBed.configureTestingModule({
      providers: [
        EditorStore,
        { provide: AnalysisRunner, useValue: { result, refusal } },
        { provide: EditFeedback, useValue: { report } },
      ],
    });
    store = TestBed.inject(EditorStore);
    store.setCatalogue(CATALOGUE);
    store.load(chainDto());
    fixture = TestBed.createComponent(StageStripComponent);
    fixture.componentRef.setInput('listId', 'strip');
    fixture.componentRef.setInput('stages', store.doc().stages);
    await fixture.whenStable();
  });

  describe('cards', () => {
    it('should show one card per stage with its key values in engineering notation', () => {
      expect(cardIds()).toEqual(['src', 'tank', 'amp', 'load']);
      expect(card('tank').textContent).toContain('Inductance 22 µH');
      expect(card('tank').textContent).toContain('Capacitance 100 pF');
    });

    it('should show a flag by colour class, icon and words for screen readers', async () => {
      result.set(resultWith([flag('warning', 'Tank loaded to half its Q.')]));
      await fixture.whenStable();
      const item = card('tank').querySelector('[data-flag-code="tank-overloaded"]')!;
      expect(item.classList).toContain('warning');
      expect(item.querySelector('cw-glyph svg')).not.toBeNull();
      expect(item.querySelector('.cw-visually-hidden')?.textContent).toBe('Warning: ');
      expect(item.textContent).toContain('Tank loaded to half its Q.');
      expect(card('amp').querySelector('[data-flag-code]')).toBeNull();
    });

    it('should mark the stage a refused analysis names', async () => {
      refusal.set({
        message: 'bad',
        issues: [{ stageId: 'amp', param: 'gain', path: [], message: 'gain must be a number' }],
      });
      await fixture.whenStable();
      expect(card('amp').querySelector('article')!.classList).toContain('faulty');
      expect(card('amp').textContent).toContain('Not analysed: gain must be a number');
    });
  });

  describe('moving stages without a pointer', () => {
    it('should not offer to move the source or a stage past the load', () => {
      expect(button('src', 'Move right').disabled).toBe(true);
      expect(button('tank', 'Move left').disabled).toBe(true);
      expect(button('tank', 'Move right').disabled).toBe(false);
      expect(button('amp', 'Move right').disabled).toBe(true);
    });

    it('should move a stage right with its button', () => {
      button('tank', 'Move right').click();
      expect(store.doc().stages.map((s) => s.id)).toEqual(['src', 'amp', 'tank', 'load']);
      expect(report).toHaveBeenCalledWith({ ok: true });
    });

    it('should move a stage left with Alt+ArrowLeft and remove it with Delete', () => {
      key('amp', { key: 'ArrowLeft', altKey: true });
      expect(store.doc().stages.map((s) => s.id)).toEqual(['src', 'amp', 'tank', 'load']);
      key('amp', { key: 'Delete' });
      expect(store.doc().stages.map((s) => s.id)).toEqual(['src', 'tank', 'load']);
    });

    it('should keep the focus on the moved card, and give it to the card before a removed one', async () => {
      card('amp').focus();
      key('amp', { key: 'ArrowLeft', altKey: true });
      await rerender();
      expect(document.activeElement).toBe(card('amp'));
      key('amp', { key: 'Delete' });
      await rerender();
      expect(cardIds()).toEqual(['src', 'tank', 'load']);
      expect(document.activeElement).toBe(card('src'));
    });

    it('should give the focus to the copy after a duplicate', async () => {
      card('tank').focus();
      key('tank', { key: 'd', ctrlKey: true });
      await rerender();
      const copy = store.doc().stages[2].id;
      expect(copy).not.toBe('tank');
      expect(document.activeElement).toBe(card(copy));
    });

    it('should report why the source cannot be removed', () => {
      key('src', { key: 'Delete' });
      expect(report).toHaveBeenCalledWith({
        ok: false,
        reason: expect.stringMatching(/needs a source/),
      });
    });
  });

  // Helpers

  /** The page re-renders the strip with the edited document; so does the test. */
  async function rerender(): Promise<void> {
    fixture.componentRef.setInput('stages', store.doc().stages);
    await fixture.whenStable();
  }

  function host(): HTMLElement {
    return fixture.nativeElement as HTMLElement;
  }

  function cardIds(): string[] {
    return [...host().querySelectorAll('article')].map((a) => a.getAttribute('data-stage-id')!);
  }

  function card(id: string): HTMLElement {
    return host().querySelector(`article[data-stage-id="${id}"]`)!.closest('.slot') as HTMLElement;
  }

  function button(id: string, label: string): HTMLButtonElement {
    return card(id).querySelector(`button[aria-label="${label}"]`) as HTMLButtonElement;
  }

  function key(id: string, init: KeyboardEventInit): void {
    card(id).dispatchEvent(new KeyboardEvent('keydown', { ...init, bubbles: true }));
  }
});

function flag(severity: Flag['severity'], message: string): Flag {
  return { code: 'tank-overloaded', severity, stageId: 'tank', message };
}

function resultWith(flags: Flag[]): AnalysisResult {
  return {
    engineVersion: 'test',
    f0Hz: 1e6,
    nodes: [],
    stages: [],
    resonators: [],
    selectivity: [],
    levels: {
      noiseFloorDbm: -130,
      noiseFigureDb: 3,
      totalGainDb: 20,
      sensitivityDbm: -120,
      sensitivityEmfRms: 1e-6,
      iip3Dbm: null,
      sfdrDb: null,
      inputAvailableDbm: -100,
      // NF 3 dB at 290 K: T = 290 (10^0.3 − 1) ≈ 289 K (IEEE noise-temperature definition).
      noiseTemperatureK: 289,
      sourceNoiseTemperatureK: 290,
      systemNoiseTemperatureK: 579,
    },
    flags,
  };
}
