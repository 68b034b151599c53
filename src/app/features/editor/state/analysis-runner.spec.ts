import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { AnalysisResult } from '../../../../../shared/engine/types';
import {
  PLOTTED_TRACES,
  type DifferenceSweepDto,
  type SweepColumnsDto,
} from '../../../../../shared/schema/sweep-columns';
import {
  applySignificantFigures,
  DEFAULT_SIGNIFICANT_FIGURES,
} from '../../../core/format/number-format';
import { sampleDocument } from '../testing/catalogue-fixture';
import { ANALYSIS_QUIET_MS, AnalysisRunner, EDIT_TO_RENDER_MEASURE } from './analysis-runner';

describe('AnalysisRunner', () => {
  let runner: AnalysisRunner;
  let http: HttpTestingController;

  beforeEach(() => {
    // The page's performance timeline stays real: the runner writes marks into it.
    jest.useFakeTimers({ doNotFake: ['performance'] });
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), AnalysisRunner],
    });
    runner = TestBed.inject(AnalysisRunner);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    applySignificantFigures(DEFAULT_SIGNIFICANT_FIGURES);
    http.verify();
    jest.useRealTimers();
  });

  describe('when edits are sent', () => {
    it('should send an edit made after a quiet spell at once', () => {
      runner.request(doc('a'));
      const req = http.expectOne('/api/analysis');
      expect(runner.pending()).toBe(true);
      expect(req.request.method).toBe('POST');
      expect(req.request.body).toEqual({
        document: doc('a'),
        sweep: true,
        traces: PLOTTED_TRACES,
        sweepPacking: 'differences',
        figures: DEFAULT_SIGNIFICANT_FIGURES,
      });
      req.flush(result(1));
      expect(runner.pending()).toBe(false);
    });

    it('should send the workspace whose data files the stages refer to', () => {
      runner.request(doc('a'), 'w1');
      jest.advanceTimersByTime(ANALYSIS_QUIET_MS);
      const req = http.expectOne('/api/analysis');
      expect(req.request.body).toEqual({
        document: doc('a'),
        sweep: true,
        traces: PLOTTED_TRACES,
        sweepPacking: 'differences',
        workspaceId: 'w1',
        figures: DEFAULT_SIGNIFICANT_FIGURES,
      });
      req.flush(result(1));
    });

    it('should read the sweep the server sends in columns into per-node series', () => {
      const columns: SweepColumnsDto = {
        digits: 6,
        freqsHz: [1e6, 2e6, 3e6],
        nodes: [0, 2],
        stepUpDb: [
          [0, -1, -2],
          [3, 4.5, 6],
        ],
        zInRe: [50, 51, 52],
        zInIm: [1, 0, -1],
        returnLossDb: [20, 30, 25],
      };
      send('a').flush({ ...result(2e6), sweep: columns });
      const sweep = runner.result()!.sweep!;
      expect(sweep.freqsHz).toEqual([1e6, 2e6, 3e6]);
      expect(sweep.nodes).toEqual([
        { index: 0, stepUpDb: [0, -1, -2], phaseDeg: [] },
        { index: 2, stepUpDb: [3, 4.5, 6], phaseDeg: [] },
      ]);
      expect(sweep.zIn).toEqual({ re: [50, 51, 52], im: [1, 0, -1] });
      expect(sweep.returnLossDb).toEqual([20, 30, 25]);
    });

    it('should read a sweep sent as differences into the values the plain columns carry', () => {
      const columns: DifferenceSweepDto = {
        digits: 6,
        packing: 'differences',
        // 1, 2, 3 MHz: 1e6, then a step of 1e6, then no change of step.
        freqsHz: { decimals: 0, steps: [1e6, 1e6, 0] },
        nodes: [0],
        // -0.25, -0.5, -1.125 dB in counts of 0.001 dB, and a column sent plain.
        stepUpDb: [{ decimals: 3, steps: [-250, -250, -375] }],
        zInRe: [50, 51, 52],
        zInIm: { decimals: -2, steps: [3, -1, 2] },
        returnLossDb: { decimals: 1, steps: [201, 0, 0] },
      };
      send('a').flush({ ...result(2e6), sweep: columns });
      const sweep = runner.result()!.sweep!;
      expect(sweep.freqsHz).toEqual([1e6, 2e6, 3e6]);
      expect(sweep.nodes).toEqual([{ index: 0, stepUpDb: [-0.25, -0.5, -1.125], phaseDeg: [] }]);
      expect(sweep.zIn).toEqual({ re: [50, 51, 52], im: [300, 200, 300] });
      expect(sweep.returnLossDb).toEqual([20.1, 20.1, 20.1]);
    });

    it('should gather quick edits and send the last once they pause, cancelling the first', () => {
      runner.request(doc('a'));
      const first = http.expectOne('/api/analysis');
      jest.advanceTimersByTime(ANALYSIS_QUIET_MS - 10);
      runner.request(doc('b'));
      jest.advanceTimersByTime(ANALYSIS_QUIET_MS - 10);
      runner.request(doc('c'));
      jest.advanceTimersByTime(ANALYSIS_QUIET_MS - 1);
      http.expectNone((r) => r.url === '/api/analysis' && r.body.document.name !== 'a');
      jest.advanceTimersByTime(1);
      const last = http.match('/api/analysis').filter((r) => !r.cancelled);
      expect(first.cancelled).toBe(true);
      expect(last.map((r) => r.request.body.document.name)).toEqual(['c']);
      last[0].flush(result(1));
      expect(runner.result()?.f0Hz).toBe(1);
    });
  });

  describe('the figures of the flag sentences', () => {
    it("should send the user's figures and ask again for the same document when they change", () => {
      applySignificantFigures(6);
      runner.request(doc('a'), 'w1');
      jest.advanceTimersByTime(ANALYSIS_QUIET_MS);
      const first = http.expectOne('/api/analysis');
      expect(first.request.body.figures).toBe(6);
      first.flush(result(1));
      TestBed.tick();
      http.expectNone('/api/analysis'); // the same figures ask for nothing more

      applySignificantFigures(3);
      TestBed.tick();
      jest.advanceTimersByTime(ANALYSIS_QUIET_MS);
      const again = http.expectOne('/api/analysis');
      expect(again.request.body).toEqual({
        document: doc('a'),
        sweep: true,
        traces: PLOTTED_TRACES,
        sweepPacking: 'differences',
        workspaceId: 'w1',
        figures: 3,
      });
      again.flush(result(2));
      expect(runner.result()?.f0Hz).toBe(2);
    });

    it('should ask for nothing when the figures change before any document was queued', () => {
      applySignificantFigures(7);
      TestBed.tick();
      jest.advanceTimersByTime(ANALYSIS_QUIET_MS);
      http.expectNone('/api/analysis');
    });
  });

  describe('cancelling stale requests', () => {
    it('should cancel the request in flight when a newer edit is sent', () => {
      runner.request(doc('old'));
      jest.advanceTimersByTime(ANALYSIS_QUIET_MS);
      const stale = http.expectOne('/api/analysis');
      runner.request(doc('new'));
      jest.advanceTimersByTime(ANALYSIS_QUIET_MS);
      expect(stale.cancelled).toBe(true);
      const fresh = http.expectOne('/api/analysis');
      expect(fresh.request.body.document.name).toBe('new');
      fresh.flush(result(2e6));
      expect(runner.result()?.f0Hz).toBe(2e6);
      expect(runner.pending()).toBe(false);
    });
  });

  describe('results and refusals', () => {
    it('should expose the latest result as a signal', () => {
      expect(runner.result()).toBeNull();
      send('a').flush(result(7.1e6));
      expect(runner.result()?.f0Hz).toBe(7.1e6);
    });

    it('should keep the last good result and show the refusal on 422', () => {
      send('a').flush(result(1e6));
      send('b').flush(
        {
          error: 'invalid-chain',
          message: 'Stage 2 (Tank): inductance must be above 0 H',
          details: [
            {
              stageId: 'tank',
              stageIndex: 1,
              param: 'l',
              path: ['stages', 1, 'values', 'l'],
              message: 'inductance must be above 0 H',
            },
          ],
        },
        { status: 422, statusText: 'Unprocessable Entity' },
      );
      expect(runner.result()?.f0Hz).toBe(1e6);
      expect(runner.refusal()).toEqual({
        message: 'Stage 2 (Tank): inductance must be above 0 H',
        issues: [expect.objectContaining({ stageId: 'tank', param: 'l' })],
      });
    });

    it('should clear the refusal once an edit analyses again', () => {
      send('a').flush({ message: 'bad' }, { status: 422, statusText: 'Unprocessable Entity' });
      expect(runner.refusal()?.message).toBe('bad');
      send('b').flush(result(1e6));
      expect(runner.refusal()).toBeNull();
    });

    it('should report other failures and keep running for later edits', () => {
      send('a').flush(
        { error: 'x', message: 'engine crashed' },
        { status: 500, statusText: 'Error' },
      );
      expect(runner.failure()).toMatch(/engine crashed/i);
      send('b').flush(result(3e6));
      expect(runner.failure()).toBeNull();
      expect(runner.result()?.f0Hz).toBe(3e6);
    });
  });

  describe('a turning knob’s live figures', () => {
    it('should lay them over the server’s result until the next server answer replaces them', () => {
      runner.request(doc('a'));
      jest.advanceTimersByTime(ANALYSIS_QUIET_MS);
      http.expectOne('/api/analysis').flush(result(1));
      const server = runner.result()!;
      const sweep = { freqsHz: [1e6], nodes: [] } as unknown as NonNullable<
        AnalysisResult['sweep']
      >;
      runner.showLive({ sweep, nodes: [], stages: [], levels: { ...server.levels, totalGainDb: 7 } }); // prettier-ignore
      expect(runner.turning()).toBe(true);
      expect(runner.shown()!.levels.totalGainDb).toBe(7);
      expect(runner.shown()!.sweep).toBe(sweep);
      expect(runner.shown()!.resonators).toBe(server.resonators);
      expect(runner.result()!.levels.totalGainDb).toBe(20);
      // The released value goes to the server; its answer is what is shown (and saved).
      runner.request(doc('b'));
      jest.advanceTimersByTime(ANALYSIS_QUIET_MS);
      http.expectOne('/api/analysis').flush(result(2));
      expect(runner.turning()).toBe(false);
      expect(runner.shown()!.levels.totalGainDb).toBe(20);
      expect(runner.shown()!.f0Hz).toBe(2);
    });
  });

  describe('edit-to-render measure', () => {
    it('should measure from the edit that was analysed, not from a later one', () => {
      const timeline = fakeTimeline();
      send('a').flush(result(1e6));
      timeline.mark.mockReturnValueOnce({ name: 'cw-edit', startTime: 5000 });
      runner.request(doc('b'));
      TestBed.tick();
      expect(timeline.measure).toHaveBeenCalledWith(EDIT_TO_RENDER_MEASURE, {
        start: 1000,
        end: expect.any(Number),
      });
      jest.advanceTimersByTime(ANALYSIS_QUIET_MS);
      http.expectOne('/api/analysis').flush(result(2e6));
      TestBed.tick();
      expect(timeline.measure).toHaveBeenLastCalledWith(EDIT_TO_RENDER_MEASURE, {
        start: 5000,
        end: expect.any(Number),
      });
      timeline.restore();
    });

    it('should measure from the edit to the rendered result, not before the render', () => {
      const timeline = fakeTimeline();
      send('a').flush(result(1e6));
      expect(timeline.measure).not.toHaveBeenCalled();
      TestBed.tick();
      expect(timeline.mark).toHaveBeenCalledWith('cw-edit');
      expect(timeline.measure).toHaveBeenCalledWith(EDIT_TO_RENDER_MEASURE, {
        start: 1000,
        end: expect.any(Number),
      });
      timeline.restore();
    });
  });

  // Helpers

  function send(name: string) {
    runner.request(doc(name));
    jest.advanceTimersByTime(ANALYSIS_QUIET_MS);
    return http.expectOne('/api/analysis');
  }
});

/** jsdom has no performance timeline: stand in the three calls the runner makes. */
function fakeTimeline() {
  const marks = new Set<string>();
  const fakes = {
    mark: jest.fn((name: string) => {
      marks.add(name);
      return { name, startTime: 1000 };
    }),
    clearMarks: jest.fn((name: string) => void marks.delete(name)),
    measure: jest.fn(),
  };
  for (const [key, value] of Object.entries(fakes)) {
    Object.defineProperty(performance, key, { value, configurable: true });
  }
  return {
    ...fakes,
    restore: () =>
      Object.keys(fakes).forEach(
        (key) => delete (performance as unknown as Record<string, unknown>)[key],
      ),
  };
}

function doc(name: string) {
  return { ...sampleDocument(), name };
}

function result(f0Hz: number): AnalysisResult {
  return {
    engineVersion: 'test',
    f0Hz,
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
    flags: [],
  };
}
