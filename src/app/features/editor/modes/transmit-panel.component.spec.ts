import { TestBed } from '@angular/core/testing';
import type { AnalysisResult } from '../../../../../shared/engine/types';
import { sampleResult, sampleTransmit as transmit } from '../results/testing/sample-analysis';
import { TransmitPanelComponent } from './transmit-panel.component';

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
    expect(text('[data-key="delivered"] dd')).toContain('94.50 mW');
    // The stated figures read as stated: the frequency whole, the limit unpadded.
    expect(text('#cw-tx-head')).toBe('Transmit at 433.92 MHz');
    expect(text('tr[data-harmonic="2"] td:nth-of-type(3)')).toBe('20 dB');
    expect(text('tr[data-harmonic="2"]')).toContain('over limit');
    expect(text('tr[data-harmonic="3"]')).toContain('within limit');
    expect(text('[data-key="receiver-input"] dd')).toContain('isolation 34.20 dB');
    const parts = [...el.querySelectorAll('tr[data-stage-id] th')].map((th) =>
      th.textContent!.trim(),
    );
    // A part whose label already names its stage keeps it; another gets its stage's name.
    expect(parts).toEqual(['PA match, part 1 (series)', 'Receive side · part 2 (series L)']);
    expect(text('tr[data-stage-id="rx-idle"]')).toContain('over limit');
    // The part's rating is stated beside its verdict, as the report prints it.
    expect(text('tr[data-stage-id="rx-idle"]')).toContain('2 V peak');
  });
});
