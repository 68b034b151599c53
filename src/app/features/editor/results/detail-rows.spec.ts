import {
  flagCounts,
  flagItems,
  loadingState,
  offsetHeadings,
  resonatorRows,
  selectivityRows,
  stageLabel,
  summaryItems,
} from './detail-rows';
import { decibels, NO_VALUE } from './format-quantity';
import { sampleDocument, sampleResult, sampleTransmit } from './testing/sample-analysis';

describe('detail-rows', () => {
  const result = sampleResult();
  const document = sampleDocument();
  const thresholds = document.settings.thresholds;

  describe('stageLabel', () => {
    it('should use the label the user gave', () => {
      expect(stageLabel(document, 'lna')).toBe('LNA');
    });

    it('should fall back to the type for an unlabelled stage and to the id for a missing one', () => {
      const unlabelled = sampleDocument();
      unlabelled.stages[2].label = '  ';
      expect(stageLabel(unlabelled, 'lna')).toBe('amplifier');
      expect(stageLabel(document, 'gone')).toBe('gone');
    });
  });

  describe('loadingState', () => {
    it('should judge the ratio as shown (two decimals): 0.50 either side of rounding is a match', () => {
      expect(loadingState(0.5, thresholds)).toBe('matched');
      expect(loadingState(0.4999999, thresholds)).toBe('matched');
      expect(loadingState(0.5000001, thresholds)).toBe('matched');
      expect(loadingState(0.51, thresholds)).toBe('fine');
    });

    it('should judge the ratio against the chain thresholds, edges included', () => {
      expect(loadingState(0.49, thresholds)).toBe('warning');
      expect(loadingState(0.2, thresholds)).toBe('warning');
      expect(loadingState(0.19, thresholds)).toBe('error');
      expect(loadingState(null, thresholds)).toBe('unknown');
    });
  });

  describe('resonatorRows', () => {
    const rows = resonatorRows(result, document);

    it('should show Q and bandwidth with the downstream side attached and removed', () => {
      expect(rows[0]).toMatchObject({
        stage: 'Preselector',
        resonance: '10.02 MHz',
        loadedQ: '25.00',
        unloadedQ: '180.0',
        bandwidth: '400.8 kHz',
        detachedQ: '90.00',
        detachedBandwidth: '111.3 kHz',
        loadingRatio: '0.2800',
        downstreamShare: '72.00 %',
        loading: 'warning',
      });
    });

    it('should say whether a stage declared the resonator or the analysis found it, and of what', () => {
      expect(rows[0].origin).toBe('declared');
      const found = sampleResult();
      found.resonators[0] = { ...found.resonators[0], origin: 'found', partOf: ['tank', 'lna'] };
      expect(resonatorRows(found, document)[0].origin).toBe('found: Preselector + LNA');
    });

    it('should show where a coupled pair peaks, and nothing for a single tank', () => {
      expect(rows[0].pairPeak).toBe('');
      const pair = sampleResult();
      pair.resonators[0] = { ...pair.resonators[0], pairPeakHz: 9.87e6 };
      expect(resonatorRows(pair, document)[0].pairPeak).toBe('9.870 MHz');
    });

    it('should say when there is no resonance in the sweep', () => {
      expect(rows[1].resonance).toBe('none in sweep');
      expect(rows[1].loadedQ).toBe(NO_VALUE);
      expect(rows[1].node).toBe('inside stage');
    });
  });

  describe('selectivityRows', () => {
    const rows = selectivityRows(result);

    it('should show bandwidths, shape factor and image rejection per node', () => {
      expect(rows[1]).toMatchObject({
        node: 4,
        after: 'IF filter',
        bw3: '9.000 kHz',
        bw60: '40.00 kHz',
        shapeFactor: '4.440',
        image: '10.91 MHz',
        imageRejection: '24.50 dB',
      });
    });

    it('should state the floor where the response levels off near −60 dB', () => {
      const floor = sampleResult();
      floor.selectivity[1] = { ...floor.selectivity[1], bw60dbHz: null, depthDb: 60.04 };
      expect(selectivityRows(floor)[1].bw60).toBe('floor at −60.04 dB');
    });

    it('should say when the −60 dB points lie beyond the sweep', () => {
      expect(rows[0].bw60).toBe('beyond sweep');
      expect(rows[0].image).toBe(NO_VALUE);
    });

    it('should show the attenuation on both sides of each offset', () => {
      expect(offsetHeadings(document)).toEqual(['±100 kHz']); // the offset as stated
      // The attenuations are results: their trailing zeros stay.
      expect(rows[1].offsets).toEqual(['62.10 dB / 63.00 dB']);
    });
  });

  describe('summaryItems', () => {
    const items = summaryItems(result, document);
    const item = (key: string) => items.find((i) => i.key === key);

    it('should give the sensitivity as source EMF in rms with the peak beside it', () => {
      expect(item('sensitivity-emf')).toMatchObject({
        value: '410.0 nV rms',
        note: '579.8 nV peak',
      });
    });

    it('should state the channel the noise floor is measured in', () => {
      expect(item('noise-floor')).toMatchObject({
        value: '-134.0 dBm',
        note: 'in a 10 kHz channel at 290 K', // the user's settings, not padded
      });
    });

    it('should show a missing dynamic range as a dash', () => {
      const noLinearity = sampleResult();
      noLinearity.levels.sfdrDb = null;
      expect(summaryItems(noLinearity, document).find((i) => i.key === 'sfdr')?.value).toBe(
        NO_VALUE,
      );
    });

    it("should give a transmit mode's figures, and no receive noise figure", () => {
      const tx = summaryItems({ ...sampleResult(), transmit: sampleTransmit() }, document);
      const keys = tx.map((i) => i.key);
      expect(keys).not.toContain('nf');
      expect(keys).not.toContain('sensitivity');
      const of = (key: string) => tx.find((i) => i.key === key);
      expect(of('tx-delivered')).toMatchObject({ label: 'Into the antenna', value: '94.50 mW' });
      // The stated limit reads as stated: "20 dB", not "20.00 dB".
      expect(of('tx-harmonic-2')?.note).toContain('over the 20 dB limit');
      expect(of('tx-harmonic-3')?.note).toContain('within the 20 dB limit');
      expect(of('tx-isolation')).toMatchObject({ value: decibels(34.2) });
      expect(of('tx-isolation')?.note).toContain('no limit stated');
      expect(of('tx-parts')?.value).toBe('1 of 1');
    });
  });

  describe('flagItems', () => {
    it('should put errors first, then warnings, then notes', () => {
      expect(flagItems(result, document).map((i) => i.flag.severity)).toEqual([
        'error',
        'warning',
        'info',
      ]);
    });

    it('should order flags of one severity by their place in the chain', () => {
      const twoWarnings = sampleResult();
      twoWarnings.flags = [
        { code: 'compression', severity: 'warning', stageId: 'mix', message: 'b' },
        { code: 'tank-detuned', severity: 'warning', stageId: 'tank', message: 'a' },
      ];
      expect(flagItems(twoWarnings, document).map((i) => i.stageLabel)).toEqual([
        'Preselector',
        'Mixer',
      ]);
    });

    it('should name the severity in words', () => {
      expect(flagItems(result, document).map((i) => i.severityText)).toEqual([
        'Error',
        'Warning',
        'Note',
      ]);
    });

    it('should count flags by severity', () => {
      expect(flagCounts(result)).toEqual({ error: 1, warning: 1, info: 1 });
    });
  });
});
