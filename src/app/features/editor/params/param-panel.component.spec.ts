import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import type { StageTypeInfo } from '../../../../../shared/engine/types';
import type { DataFileDto, WorkspaceRole } from '../../../../../shared/schema/api';
import { chainDto } from '../testing/chain-dto';
import { AnalysisRunner } from '../state/analysis-runner';
import { EditorStore } from '../state/editor.store';
import { CATALOGUE, stage } from '../testing/catalogue-fixture';
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

  describe('a data file uploading while the form is used', () => {
    let http: HttpTestingController;

    beforeEach(async () => {
      TestBed.configureTestingModule({
        providers: [provideHttpClient(), provideHttpClientTesting(), EditorStore, AnalysisRunner],
      });
      http = TestBed.inject(HttpTestingController);
      store = TestBed.inject(EditorStore);
      store.setCatalogue([...CATALOGUE, MEASURED]);
      const chain = chainDto('editor');
      const [src, ...rest] = chain.document.stages;
      chain.document = {
        ...chain.document,
        stages: [src, stage('meas', MEASURED), stage('meas2', MEASURED), ...rest],
      };
      store.load(chain);
      store.select('meas');
      fixture = TestBed.createComponent(ParamPanelComponent);
      await fixture.whenStable();
      http.expectOne('/api/workspaces/w1/files').flush([]);
      await fixture.whenStable();
    });

    afterEach(() => http.verify());

    it('should keep a value chosen while the file uploads when the upload lands before the next render', async () => {
      const upload = await startUpload();
      const noise = host().querySelector<HTMLSelectElement>('select[data-param="noise"]')!;
      noise.value = 'file';
      noise.dispatchEvent(new Event('change'));
      // The upload's answer is handled before the form is rendered again (both wait for
      // the next task; the answer can come first), so the form still holds the stage as it
      // was before the choice.
      upload.flush(STORED);
      await microtasks();
      expect(measured('meas')).toMatchObject({ dataFileId: 'f9', values: { noise: 'file' } });
      await fixture.whenStable();
      expect(noise.value).toBe('file');
      expect(dataFileSelect().value).toBe('f9');
    });

    it('should attach the file to the stage it was uploaded for, whatever is selected when it lands', async () => {
      const upload = await startUpload();
      store.select('meas2');
      await fixture.whenStable();
      upload.flush(STORED);
      await fixture.whenStable();
      expect(measured('meas').dataFileId).toBe('f9');
      expect(measured('meas2').dataFileId).toBeUndefined();
    });

    /** Picks a file in the field's hidden input and returns its upload, on its way. */
    async function startUpload() {
      const fileInput = host().querySelector<HTMLInputElement>('input[type=file]')!;
      const file = new File([AMPLIFIER_TS], 'bench-amplifier.ts');
      Object.defineProperty(fileInput, 'files', { value: [file], configurable: true });
      fileInput.dispatchEvent(new Event('change'));
      // The file is read as text before the request goes out.
      await new Promise((resolve) => setTimeout(resolve, 0));
      await fixture.whenStable();
      return http.expectOne({ method: 'POST', url: '/api/workspaces/w1/files' });
    }

    function dataFileSelect(): HTMLSelectElement {
      return host().querySelector<HTMLSelectElement>('select[data-param="dataFileId"]')!;
    }

    function measured(id: string) {
      return store.doc().stages.find((s) => s.id === id)!;
    }
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

/** A measured two-port as the panel sees it: a data file field and a noise choice. */
const MEASURED: StageTypeInfo = {
  type: 'measured-two-port',
  category: 'filter',
  role: 'two-port',
  label: 'Measured two-port',
  summary: 'S-parameters from a file.',
  params: [
    {
      key: 'noise',
      label: 'Noise',
      kind: 'enum',
      unit: 'none',
      default: 'passive',
      options: [
        { value: 'passive', label: 'Passive, from its loss' },
        { value: 'file', label: 'Parameters from the data file (active device)' },
      ],
    },
  ],
};

const AMPLIFIER_TS = '[Version] 2.0\n# MHz S RI R 50\n[Number of Ports] 2\n';

const STORED: DataFileDto = {
  id: 'f9',
  name: 'bench-amplifier.ts',
  kind: 's2p',
  portCount: 2,
  pointCount: 2,
  fMinHz: 100e6,
  fMaxHz: 200e6,
  uploadedBy: 'Ada',
  createdAt: '2026-01-01T00:00:00.000Z',
  content: AMPLIFIER_TS,
};

/** Lets promise callbacks run, and nothing that waits for a later task (a render). */
async function microtasks(): Promise<void> {
  for (let i = 0; i < 10; i++) await Promise.resolve();
}
