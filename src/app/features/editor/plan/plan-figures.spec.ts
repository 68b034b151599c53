import type { SpurResponse } from '../../../../../shared/engine/planning/spurs';
import { parseQuantity } from '../../../../../shared/units';
import type { PlanReport } from '../../../../../shared/engine/planning/plan';
import { applySignificantFigures } from '../../../core/format/number-format';
import { FALLBACK_PALETTE } from '../results/plot-theme';
import {
  parseProfile,
  profileText,
  rejectionBand,
  sortSpurs,
  spurChartFigure,
} from './plan-figures';

const hz = (t: string) => {
  const r = parseQuantity(t, 'hertz');
  return r.ok ? r.value : null;
};

const spur = (kind: SpurResponse['kind'], order: number, rfHz: number, rejectionDb: number | null): SpurResponse => ({
  kind, m: 1, n: order - 1, order, rfHz, widthHz: 1, selectivityDb: rejectionDb, suppressionDb: 0, rejectionDb, meetsTarget: rejectionDb === null ? null : rejectionDb >= 60,
}); // prettier-ignore

describe('plan figures', () => {
  it('bands a rejection against the target: meets, within 10 dB, below', () => {
    expect(rejectionBand(60, 60)).toBe('ok');
    expect(rejectionBand(50, 60)).toBe('near');
    expect(rejectionBand(49.9, 60)).toBe('bad');
    expect(rejectionBand(null, 60)).toBe('none');
  });

  it('sorts the spur table by rejection, frequency or order', () => {
    const list = [spur('spur', 4, 3e6, 70), spur('image', 2, 9e6, 14), spur('spur', 3, 1e6, null)];
    expect(sortSpurs(list, 'rejection').map((s) => s.rejectionDb)).toEqual([14, 70, null]);
    expect(sortSpurs(list, 'frequency').map((s) => s.rfHz)).toEqual([1e6, 3e6, 9e6]);
    expect(sortSpurs(list, 'order').map((s) => s.order)).toEqual([2, 3, 4]);
  });

  it('reads a phase-noise profile with units and writes it back', () => {
    const r = parseProfile('1 kHz: -90, 10k: −115; 100 kHz: -135', hz);
    expect(r).toEqual({ ok: true, profile: [{ offsetHz: 1e3, dbcHz: -90 }, { offsetHz: 10e3, dbcHz: -115 }, { offsetHz: 100e3, dbcHz: -135 }] }); // prettier-ignore
    const profile = r.ok ? r.profile : [];
    expect(parseProfile(profileText(profile), hz)).toEqual(r);
  });

  it('says what to fix in a profile that does not read', () => {
    const r = parseProfile('10 kHz -110', hz);
    expect(r.ok).toBe(false);
    expect(!r.ok && r.message).toMatch(/offset: level/);
    expect(parseProfile('10 kHz: 5', hz).ok).toBe(false);
  });

  it('ticks the spur chart in hertz with prefixes and writes its hover at the chosen figures', () => {
    const plan = {
      settings: { spurTargetDb: 60 },
      spurChart: {
        dialHz: [6e6, 7e6, 8e6],
        loSide: 'above',
        tuning: 'constant-q',
        note: '',
        lines: [{ m: 1, n: 1, kind: 'image', rfHz: [6.91e6, 7.91e6, 8.91e6], rejectionDb: [41.234, 40.5, null] }], // prettier-ignore
      },
    } as unknown as PlanReport;
    const figure = spurChartFigure(plan, FALLBACK_PALETTE)!;
    const x = figure.layout.xaxis as { ticktext: string[]; tickvals: number[] };
    expect(x.ticktext).toEqual(['6 MHz', '6.5 MHz', '7 MHz', '7.5 MHz', '8 MHz']);
    const y = figure.layout.yaxis as { ticktext: string[]; type: string };
    expect(y.type).toBe('log');
    expect(y.ticktext.every((t) => / MHz$/.test(t))).toBe(true);
    const hover = (figure.data[1] as { customdata: string[][] }).customdata;
    expect(hover[0]).toEqual(['6.000 MHz', '6.910 MHz', '41.23 dB']);
    expect(hover[2][2]).toBe('—');
    applySignificantFigures(3);
    try {
      const again = spurChartFigure(plan, FALLBACK_PALETTE)!;
      expect((again.data[1] as { customdata: string[][] }).customdata[0][2]).toBe('41.2 dB');
      expect(again.data[1].name).toBe('Image 1×LO 1×RF (≥ 40.5 dB)');
    } finally {
      applySignificantFigures(4);
    }
  });
});
