import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import type { WorkspaceRole } from '../../../../../shared/schema/api';
import { chainDto } from '../testing/chain-dto';
import { AnalysisRunner } from '../state/analysis-runner';
import { EditorStore } from '../state/editor.store';
import { CATALOGUE } from '../testing/catalogue-fixture';
import { ParamPanelComponent } from './param-panel.component';

describe('ParamPanelComponent', () => {
  let fixture: ComponentFixture<ParamPanelComponent>;
  let store: EditorStore;

  describe('form generation', () => {
    beforeEach(() => setUp('editor', 'tank'));

    it('should show one field per visible parameter, with the label', async () => {
      await fixture.whenStable();
      expect(labels()).toEqual([
        'Label',
        'Inductance',
        'Variable (tuned across a band)',
        '± %',
        'Capacitance',
        'Entry',
        'Include losses',
      ]);
    });

    it('should show a design field only when its showWhen holds', async () => {
      await fixture.whenStable();
      expect(input('q')).toBeNull();
      const select = host().querySelector<HTMLSelectElement>('select[data-param="mode"]')!;
      select.value = 'design';
      select.dispatchEvent(new Event('change'));
      await fixture.whenStable();
      expect(input('q')).not.toBeNull();
      expect(tank().values['mode']).toBe('design');
    });

    it('should offer presets when the type has them', async () => {
      store.select('amp');
      await fixture.whenStable();
      expect(buttonTexts()).toContain('Presets');
    });

    it('should apply a preset chosen from the menu', async () => {
      store.select('amp');
      await fixture.whenStable();
      [...host().querySelectorAll('button')]
        .find((b) => b.textContent!.trim() === 'Presets')!
        .click();
      await fixture.whenStable();
      const item = [...document.querySelectorAll<HTMLButtonElement>('[mat-menu-item]')].find(
        (b) => b.textContent!.trim() === 'Low gain',
      )!;
      item.click();
      await fixture.whenStable();
      expect(store.doc().stages.find((s) => s.id === 'amp')!.values['gain']).toBe(10);
      expect(input('gain')!.value).toBe('10 dB');
    });

    it('should not offer presets for a type without them', async () => {
      await fixture.whenStable();
      expect(buttonTexts()).not.toContain('Presets');
    });
  });

  describe('typing values with units', () => {
    beforeEach(() => setUp('editor', 'tank'));

    it('should store the SI value and the typed text and show the value read', async () => {
      await type('l', '22 uH');
      expect(tank().values['l']).toBeCloseTo(22e-6, 15);
      expect(tank().entered).toEqual({ l: '22 uH' });
      expect(note('l')).toBe('');
      expect(readBack('l')).toBe('= 22 µH');
    });

    it('should accept a component code', async () => {
      await type('c', '4p7');
      expect(tank().values['c']).toBeCloseTo(4.7e-12, 20);
      expect(readBack('c')).toBe('= 4.7 pF');
    });

    it('should say what is wrong, keep the typed text and keep the old value', async () => {
      const before = tank().values['l'];
      await type('l', '4.7 pF');
      expect(note('l')).toBe('expected an inductance (H), got a capacitance');
      expect(input('l')!.value).toBe('4.7 pF');
      expect(input('l')!.getAttribute('aria-invalid')).toBe('true');
      expect(tank().values['l']).toBe(before);
    });

    it('should not carry unread text over to another stage of the same type', async () => {
      await type('l', '22 uH');
      await type('l', 'not a value');
      store.duplicate('tank');
      await fixture.whenStable();
      expect(store.selectedId()).not.toBe('tank');
      expect(input('l')!.value).toBe('22 uH');
      expect(note('l')).toBe('');
    });

    it('should refuse a value below the schema minimum in the field unit', async () => {
      await type('l', '0.1 nH');
      expect(note('l')).toBe('must be at least 1 nH');
    });

    it('should set a tolerance in percent', async () => {
      await type('l:tolerance', '5 %');
      expect(tank().tolerances).toEqual({ l: 5 });
    });

    it('should mark a value variable on the chain with its range and gang, and unmark it', async () => {
      await type('l', '10 uH');
      const toggle = () =>
        host().querySelector<HTMLInputElement>(
          '[data-variable="l"] [data-testid="variable-toggle"]',
        )!;
      toggle().click();
      await fixture.whenStable();
      const [mark] = store.doc().settings.variables!;
      expect(mark).toMatchObject({ stageId: 'tank', key: 'l' });
      // The range offered starts at a third to three times the value now.
      expect(mark.min).toBeCloseTo(10e-6 / 3, 15);
      expect(mark.max).toBeCloseTo(30e-6, 15);
      const max = host().querySelector<HTMLInputElement>('[data-testid="variable-max"]')!;
      max.value = '1 nH';
      max.dispatchEvent(new Event('change'));
      await fixture.whenStable();
      expect(host().textContent).toContain('the maximum must be above the minimum');
      expect(store.doc().settings.variables![0].max).toBeCloseTo(30e-6, 15);
      const gang = host().querySelector<HTMLInputElement>('[data-testid="variable-gang"]')!;
      gang.value = 'bandspread';
      gang.dispatchEvent(new Event('change'));
      await fixture.whenStable();
      expect(store.doc().settings.variables![0].gang).toBe('bandspread');
      toggle().click();
      await fixture.whenStable();
      expect(store.doc().settings.variables).toBeUndefined();
    });

    it('should rename the stage from the label field', async () => {
      await fixture.whenStable();
      const label = host().querySelector<HTMLInputElement>('#cw-stage-label')!;
      label.value = 'Antenna tank';
      label.dispatchEvent(new Event('input'));
      await fixture.whenStable();
      expect(tank().label).toBe('Antenna tank');
    });

    it('should make a run of keystrokes in one field a single undo step', async () => {
      await type('l', '2');
      await type('l', '22');
      await type('l', '22 uH');
      store.undo();
      // The fixture's tank starts with no stored values: one undo goes all the way back.
      expect(tank().values).toEqual({});
      expect(tank().entered).toBeUndefined();
    });
  });

  describe('viewers', () => {
    beforeEach(() => setUp('viewer', 'tank'));

    it('should disable every input', async () => {
      await fixture.whenStable();
      const controls = host().querySelectorAll<HTMLInputElement>('input, select, textarea');
      expect(controls.length).toBeGreaterThan(3);
      expect([...controls].every((c) => c.disabled)).toBe(true);
    });
  });

  // Helpers

  function setUp(role: WorkspaceRole, selected: string): void {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), EditorStore, AnalysisRunner],
    });
    store = TestBed.inject(EditorStore);
    store.setCatalogue(CATALOGUE);
    store.load(chainDto(role));
    store.select(selected);
    fixture = TestBed.createComponent(ParamPanelComponent);
    fixture.componentRef.setInput('readOnly', role === 'viewer');
  }

  function host(): HTMLElement {
    return fixture.nativeElement as HTMLElement;
  }

  function input(param: string): HTMLInputElement | null {
    return host().querySelector<HTMLInputElement>(`input[data-param="${param}"]`);
  }

  async function type(param: string, text: string): Promise<void> {
    await fixture.whenStable();
    const el = input(param)!;
    el.value = text;
    el.dispatchEvent(new Event('input'));
    await fixture.whenStable();
  }

  function fieldOf(param: string): HTMLElement {
    return input(param)!.closest('cw-quantity-field') as HTMLElement;
  }

  function note(param: string): string {
    return fieldOf(param).querySelector('.note .cw-error-text')?.textContent?.trim() ?? '';
  }

  function readBack(param: string): string {
    return fieldOf(param).querySelector('output')?.textContent?.trim() ?? '';
  }

  function labels(): string[] {
    return [...host().querySelectorAll('label')].map((l) => l.textContent!.trim());
  }

  function buttonTexts(): string[] {
    return [...host().querySelectorAll('button')].map((b) => b.textContent!.trim());
  }

  function tank() {
    return store.doc().stages.find((s) => s.id === 'tank')!;
  }
});
