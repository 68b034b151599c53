import { ComponentFixture, TestBed } from '@angular/core/testing';
import { EditorStore } from '../state/editor.store';
import { CATALOGUE } from '../testing/catalogue-fixture';
import { chainDto } from '../testing/chain-dto';
import { ChainSettingsComponent } from './chain-settings.component';

describe('ChainSettingsComponent', () => {
  let fixture: ComponentFixture<ChainSettingsComponent>;
  let store: EditorStore;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [EditorStore] });
    store = TestBed.inject(EditorStore);
    store.setCatalogue(CATALOGUE);
    store.load(chainDto());
    fixture = TestBed.createComponent(ChainSettingsComponent);
    await fixture.whenStable();
  });

  describe('unit-aware settings', () => {
    it('should set the design frequency from text with a unit and keep the text', async () => {
      await type('input[data-param="f0Hz"]', '7.1 MHz');
      expect(store.doc().settings.f0Hz).toBeCloseTo(7.1e6, 3);
      expect(field('f0Hz').value).toBe('7.1 MHz');
    });

    it('should round sweep points to a whole number', async () => {
      await type('input[data-param="sweep.points"]', '400.6');
      expect(store.doc().settings.sweep.points).toBe(401);
    });

    it('should keep thresholds inside their range', async () => {
      await type('input[data-param="thresholds.loadingWarn"]', '1.5');
      expect(store.doc().settings.thresholds.loadingWarn).toBe(0.5);
      expect(host().textContent).toContain('must be at most 0.999');
    });

    it('should read a list of offsets and name the one that does not read', async () => {
      await type('#cw-offsets', '10 kHz, 20k');
      expect(store.doc().settings.offsetsHz).toEqual([10e3, 20e3]);
      await type('#cw-offsets', '10 kHz, 5 pF');
      expect(host().querySelector('#cw-offsets-note')!.textContent).toContain(
        '"5 pF": expected a frequency (Hz), got a capacitance',
      );
      expect(store.doc().settings.offsetsHz).toEqual([10e3, 20e3]);
    });

    it('should say that a chain needs a name', async () => {
      await type('#cw-chain-name', '  ');
      expect(host().textContent).toContain('a chain needs a name');
    });
  });

  // Helpers

  function host(): HTMLElement {
    return fixture.nativeElement as HTMLElement;
  }

  function field(key: string): HTMLInputElement {
    return host().querySelector<HTMLInputElement>(`input[data-param="${key}"]`)!;
  }

  async function type(selector: string, text: string): Promise<void> {
    const el = host().querySelector<HTMLInputElement>(selector)!;
    el.value = text;
    el.dispatchEvent(new Event('input'));
    await fixture.whenStable();
  }
});
