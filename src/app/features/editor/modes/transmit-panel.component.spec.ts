import { TestBed } from '@angular/core/testing';
import type { AnalysisResult } from '../../../../../shared/engine/types';
import { sampleResult } from '../results/testing/sample-analysis';
import { TransmitPanelComponent } from './transmit-panel.component';

type Transmit = NonNullable<AnalysisResult['transmit']>;

function transmit(): Transmit {
  return {
    f0Hz: 433.92e6,
    availableW: 0.1,
    deliveredW: 0.0945,
    deliveredDbm: 19.75,
    networkLossDb: 0.25,
    sourceSwingPeakV: 2.98,
    harmonics: [
      { n: 2, fHz: 867.84e6, attenuationDb: 16.3, limitDb: 20, ok: false },
      { n: 3, fHz: 1301.76e6, attenuationDb: 30.9, limitDb: 20, ok: true },
    ],
    receiverInput: { stageId: 'rx-idle', part: 'part 5', powerW: 3.6e-5, dbm: -14.4, isolationDb: 34.2, limitDbm: null, ok: null }, // prettier-ignore
    parts: [
      { stageId: 'pa-match', label: 'PA match, part 1 (series)', vPeak: 1.01, iPeak: 0.067, iRms: 0.0474, powerW: 3.4e-4, ratedPeakVolts: null, ratedRmsAmps: null, ok: null }, // prettier-ignore
      { stageId: 'rx-idle', label: 'part 2 (series L)', vPeak: 3.07, iPeak: 0.0615, iRms: 0.0435, powerW: 0, ratedPeakVolts: 2, ratedRmsAmps: null, ok: false }, // prettier-ignore
    ],
  };
}

async function render(result: AnalysisResult | null): Promise<HTMLElement> {
  const fixture = TestBed.createComponent(TransmitPanelComponent);
  fixture.componentRef.setInput('result', result);
  fixture.componentRef.setInput(
    'labels',
    new Map([
      ['pa-match', 'PA match'],
      ['rx-idle', 'Receive side'],
    ]),
  );
  await fixture.whenStable();
  return fixture.nativeElement as HTMLElement;
}

describe('TransmitPanelComponent', () => {
  it('should show nothing for a receive-only result', async () => {
    const el = await render(sampleResult());
    expect(el.querySelector('[data-testid="transmit-panel"]')).toBeNull();
  });

  it('should show the power, each harmonic against its limit and each part named once', async () => {
    const el = await render({ ...sampleResult(), transmit: transmit() });
    const text = (sel: string) => el.querySelector(sel)!.textContent!.replace(/\s+/g, ' ').trim();
    expect(text('[data-key="delivered"] dd')).toContain('94.5 mW');
    expect(text('tr[data-harmonic="2"]')).toContain('over limit');
    expect(text('tr[data-harmonic="3"]')).toContain('within limit');
    expect(text('[data-key="receiver-input"] dd')).toContain('isolation 34.2 dB');
    const parts = [...el.querySelectorAll('tr[data-stage-id] th')].map((th) =>
      th.textContent!.trim(),
    );
    // A part whose label already names its stage keeps it; another gets its stage's name.
    expect(parts).toEqual(['PA match, part 1 (series)', 'Receive side · part 2 (series L)']);
    expect(text('tr[data-stage-id="rx-idle"]')).toContain('over limit');
  });
});
