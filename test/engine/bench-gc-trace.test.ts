/**
 * The bench's reader of V8's `--trace-gc` lines (scripts/bench/gc-trace.ts), on lines as
 * Node 20 prints them (taken from a server of ours under the bench's load).
 */
import { GcTrace, parseGcLine, summariseGc } from '../../scripts/bench/gc-trace';

const MAIN = '[30895:0x371a8e90]';
const THREAD = '[30895:0x7f1fc4000f00]';
const lines = [
  `${MAIN}    63754 ms: Scavenge 252.7 (294.3) -> 230.7 (296.8) MB, 21.03 / 2.19 ms  (average mu = 0.960, current mu = 0.960) task; `,
  `${THREAD}    62703 ms: Scavenge 53.1 (91.6) -> 24.8 (93.3) MB, 9.80 / 0.12 ms  (average mu = 0.996, current mu = 0.997) allocation failure; `,
  `${MAIN}    64625 ms: Scavenge 255.9 (297.1) -> 233.5 (299.6) MB, 18.04 / 1.04 ms  (average mu = 0.960, current mu = 0.960) task; `,
  '{"level":30,"time":1796313569686,"msg":"request"}',
  `${MAIN}    65448 ms: Scavenge 257.4 (300.1) -> 236.3 (302.6) MB, 13.11 / 0.99 ms  (average mu = 0.960, current mu = 0.960) task; `,
  `${MAIN}    67227 ms: Mark-Compact 245.1 (308.1) -> 74.7 (204.3) MB, 22.57 / 0.14 ms  (+ 68.6 ms in 998 steps since start of marking, biggest step 1.1 ms, walltime since start of marking 128 ms) (average mu = 0.997, current mu = 0.999) finalize incremental marking via task; GC in old space requested`,
  `${THREAD}    67897 ms: Mark-Compact 61.1 (102.3) -> 13.9 (84.3) MB, 25.96 / 0.05 ms  (+ 24.3 ms in 118 steps since start of marking, biggest step 4.3 ms, walltime since start of marking 317 ms) (average mu = 0.996, current mu = 0.996) finalize incremental marking via stack guard; GC in old space requested`,
  `${MAIN}    68153 ms: Scavenge 101.9 (204.3) -> 78.2 (204.3) MB, 7.00 / 0.87 ms  (average mu = 0.997, current mu = 0.999) task; `,
];

describe("the bench's reading of V8's collection trace", () => {
  it('reads a young and a full collection, and nothing else', () => {
    expect(parseGcLine(lines[0])).toEqual({
      isolate: '0x371a8e90',
      at: 63754,
      kind: 'young',
      beforeMb: 252.7,
      afterMb: 230.7,
      pauseMs: 21.03,
      markingMs: 0,
    });
    expect(parseGcLine(lines[5])).toMatchObject({ kind: 'full', pauseMs: 22.57, markingMs: 68.6 });
    expect(parseGcLine(lines[3])).toBeUndefined();
  });

  it("sums up the first isolate's collections, lines split anywhere between chunks", () => {
    const trace = new GcTrace();
    const text = lines.join('\n') + '\n';
    for (let i = 0; i < text.length; i += 37) trace.feed(text.slice(i, i + 37));
    expect(trace.events).toHaveLength(7);
    expect(trace.mainIsolate).toBe('0x371a8e90');
    const g = summariseGc(trace.events, trace.mainIsolate!);
    expect(g.young).toBe(4);
    // 63754 → 68153 ms over three intervals.
    expect(g.youngEveryMs).toBeCloseTo((68153 - 63754) / 3, 6);
    expect(g.youngPauseMeanMs).toBeCloseTo((21.03 + 18.04 + 13.11 + 7.0) / 4, 6);
    expect(g.youngPauseMaxMs).toBe(21.03);
    // Grown from one young collection to the next (230.7 → 233.5 → 236.3), not across the
    // full collection between 236.3 and 78.2.
    expect(g.promotedMbPerYoung).toBeCloseTo(2.8, 6);
    expect(g).toMatchObject({ full: 1, fullPauseMaxMs: 22.57, fullMarkingMs: 68.6 });
  });

  it("reads a stretch of the trace by the isolate's clock", () => {
    const events = lines.map(parseGcLine).filter((e) => e !== undefined);
    const g = summariseGc(events, '0x371a8e90', 64000, 68000);
    expect(g.young).toBe(2);
    expect(g.youngEveryMs).toBe(65448 - 64625);
    expect(g.full).toBe(1);
    expect(summariseGc(events, '0x371a8e90', 68200, 70000).young).toBe(0);
  });
});
