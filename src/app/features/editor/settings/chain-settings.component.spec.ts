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

  describe('yield targets', () => {
    async function change(key: string, text: string): Promise<void> {
      const el = host().querySelector<HTMLInputElement>(`input[data-target="${key}"]`)!;
      el.value = text;
      el.dispatchEvent(new Event('change'));
      await fixture.whenStable();
    }

    it('should store each target from text with a unit, and drop an emptied one', async () => {
      await change('centreMinHz', '7.1 MHz');
      await change('centreMaxHz', '7.3 MHz');
      await change('maxNoiseFigureDb', '5 dB');
      expect(store.doc().settings.targets).toEqual({ centreMinHz: 7.1e6, centreMaxHz: 7.3e6, maxNoiseFigureDb: 5 }); // prettier-ignore
      await change('maxNoiseFigureDb', '');
      await change('centreMinHz', '');
      await change('centreMaxHz', '');
      expect(store.doc().settings.targets).toBeUndefined();
    });

    it('should refuse a maximum below its minimum, saying so, and keep what was there', async () => {
      await change('minBandwidthHz', '300 kHz');
      await change('maxBandwidthHz', '200 kHz');
      expect(host().textContent).toContain('the maximum bandwidth must not be below the minimum');
      expect(store.doc().settings.targets).toEqual({ minBandwidthHz: 300e3 });
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
