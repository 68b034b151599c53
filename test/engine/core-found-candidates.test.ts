/**
 * Gathering found resonances with their twins merged (found-candidates.ts): what it keeps is
 * what measuring every candidate as it came kept (the merge as it was written first, restated
 * here), while a candidate a declared resonator covers is measured only when a twin needs it;
 * and a whole analysis that takes that path (signal and image at a declared tank's node).
 */
import fc from 'fast-check';
import { analyzeChain } from '../../shared/engine';
import { gatherCandidates, type Candidate } from '../../shared/engine/core/found-candidates';
import type { NodeResonance } from '../../shared/engine/core/resonance-search';
import type { Claim } from '../../shared/engine/core/resonator-context';
import { parseChainDocument } from '../../shared/schema/parse-chain';

interface Offer {
  node: number;
  res: NodeResonance;
  claim: Claim;
}

/** The merge measuring every candidate as it comes. */
function measuredAsTheyCome<F>(
  offers: Offer[],
  f0: number,
  measure: (node: number, res: NodeResonance) => F | null,
): Candidate<F>[] {
  const kept: Candidate<F>[] = [];
  for (const { node, res, claim } of offers) {
    const twin = kept.find((c) => c.node === node && Math.abs(c.res.fr / res.fr - 1) < 1e-6);
    if (twin && Math.abs(Math.log(res.fIn / f0)) >= Math.abs(Math.log(twin.res.fIn / f0))) continue; // prettier-ignore
    const fig = measure(node, res);
    if (fig === null) continue;
    if (twin) Object.assign(twin, { res, fig, claim });
    else kept.push({ node, res, claim, fig });
  }
  return kept;
}

const F0 = 1e6;
/** Resonances at two nodes, at a few node frequencies (so twins meet), signal or image side. */
const offerArb = fc.record({
  node: fc.integer({ min: 0, max: 1 }),
  fr: fc.constantFrom(455e3, 455e3 * (1 + 3e-7), 455e3 * (1 + 4e-6), 700e3),
  fIn: fc.double({ min: 0.2e6, max: 3e6, noNaN: true }),
  q: fc.double({ min: 1, max: 200, noNaN: true }),
  g: fc.double({ min: 1e-6, max: 1, noNaN: true }),
  counts: fc.boolean(),
});

describe('gatherCandidates', () => {
  it('keeps what measuring every candidate kept, measuring no more (property)', () => {
    let deferredTotal = 0;
    let resolvedTotal = 0;
    fc.assert(
      fc.property(
        fc.array(offerArb, { maxLength: 12 }),
        fc.double({ min: 0, max: 0.2, noNaN: true }),
        (raw, coverBw) => {
          const offers: Offer[] = raw.map(({ node, fr, fIn, q, g }) => ({
            node,
            res: { fIn, fr, g, q, sign: 1 },
            claim: { segment: node, fr, bw: fr / q },
          }));
          const counts = new Map(offers.map((o, i) => [o.res, raw[i].counts]));
          // Figures are the resonance's own (measurement is a function of it alone).
          const measure = (node: number, res: NodeResonance) =>
            counts.get(res) ? { node, fIn: res.fIn } : null;
          // A declared resonator at 455 kHz in segment 0, as wide as coverBw of it.
          const covered = (c: Claim) => c.segment === 0 && Math.abs(c.fr - 455e3) <= Math.max(c.bw, coverBw * 455e3); // prettier-ignore
          let eager = 0;
          const reference = measuredAsTheyCome(offers, F0, (n, r) => (eager++, measure(n, r)));
          let lazy = 0;
          const g = gatherCandidates(F0, (n, r) => (lazy++, measure(n, r)), covered);
          for (const o of offers) g.offer(o.node, o.res, o.claim);
          // Every candidate left unmeasured is covered, so never reported; measured now,
          // with those that do not count left out, they leave the reference's list exactly.
          const unmeasured = g.candidates.filter((c) => c.fig === null);
          expect(unmeasured.every((c) => covered(c.claim))).toBe(true);
          const resolved = g.candidates.flatMap((c) => {
            const fig = c.fig ?? measure(c.node, c.res);
            return fig === null ? [] : [{ ...c, fig }];
          });
          expect(resolved).toEqual(reference);
          expect(lazy).toBeLessThanOrEqual(eager);
          deferredTotal += eager - lazy;
          resolvedTotal += offers.length > 0 && lazy > 0 ? 1 : 0;
        },
      ),
      { numRuns: 2000 },
    );
    // The runs exercised the saving and measurement alike.
    expect(deferredTotal).toBeGreaterThan(0);
    expect(resolvedTotal).toBeGreaterThan(0);
  });

  it('measures a deferred candidate when its twin comes, and the nearer twin takes its place', () => {
    const claimAt = (fr: number, q: number, segment = 0): Claim => ({ segment, fr, bw: fr / q });
    const image: NodeResonance = { fIn: 0.09e6, fr: 455e3, g: 1e-3, q: 50, sign: 1 };
    const signal: NodeResonance = { fIn: 1e6, fr: 455e3 * (1 + 1e-7), g: 2e-3, q: 40, sign: -1 };
    const measured: NodeResonance[] = [];
    const g = gatherCandidates(
      F0,
      (_n, res) => (measured.push(res), { q: res.q }),
      (c) => c.fr < 460e3, // a declared tank covers both views
    );
    g.offer(3, image, claimAt(image.fr, image.q));
    expect(g.candidates).toEqual([{ node: 3, res: image, claim: claimAt(image.fr, image.q), fig: null }]); // prettier-ignore
    expect(measured).toEqual([]);
    g.offer(3, signal, claimAt(signal.fr, signal.q));
    // The deferred image was measured to judge the twin, then the signal (nearer f0) replaced it.
    expect(measured).toEqual([image, signal]);
    expect(g.candidates).toEqual([{ node: 3, res: signal, claim: claimAt(signal.fr, signal.q), fig: { q: 40 } }]); // prettier-ignore
  });

  it('drops a deferred twin that does not count, and the later view is judged afresh', () => {
    const image: NodeResonance = { fIn: 0.09e6, fr: 455e3, g: 1e-3, q: 50, sign: 1 };
    const signal: NodeResonance = { fIn: 1e6, fr: 455e3, g: 2e-3, q: 40, sign: -1 };
    const claim = { segment: 0, fr: 455e3, bw: 1e4 };
    const g = gatherCandidates(
      F0,
      (_n, res) => (res === image ? null : { q: res.q }),
      () => true,
    );
    g.offer(1, image, claim);
    g.offer(1, signal, claim);
    // The image does not count, so the signal has no twin: covered, it waits unmeasured.
    expect(g.candidates).toEqual([{ node: 1, res: signal, claim, fig: null }]);
  });
});

describe('a declared tank behind a low-side mixer, the image in the sweep', () => {
  // Our own scenario: 7 MHz in, LO 6.545 MHz below it, a 455 kHz tank at the mixer's output.
  // Signal (7 MHz) and image (6.09 MHz) both reach the tank's node, whose found views are
  // covered by the declared tank: the image's view waits unmeasured until the signal's
  // comes as its twin.
  const l = 100e-6;
  const c = 1 / ((2 * Math.PI * 455e3) ** 2 * l);
  const at = (startHz: number) =>
    parseChainDocument({
      name: 'low-side conversion into a declared IF tank',
      settings: { f0Hz: 7e6, sweep: { startHz, stopHz: 8e6, points: 2001, scale: 'lin' } },
      stages: [
        { id: 'gen', type: 'resistive-generator', values: { r: 50 } },
        { id: 'mix', type: 'mixer', values: { conversion: 'down', loSource: 'from-if', ifHz: 455e3, side: 'low', rout: 5000 } }, // prettier-ignore
        { id: 'ift', type: 'shunt-lc-tank', values: { l, c, ql: 100, qc: 800 } },
        { id: 'det', type: 'envelope-detector', values: { rLoad: 47000 } },
      ],
    });

  it('reports the tank once, as a sweep without the image does', () => {
    const wide = analyzeChain(at(5.5e6)).resonators;
    const narrow = analyzeChain(at(6.8e6)).resonators;
    expect(wide.map((r) => [r.stageId, r.origin])).toEqual([['ift', 'declared']]);
    expect(narrow.map((r) => [r.stageId, r.origin])).toEqual([['ift', 'declared']]);
    for (const key of ['resonanceHz', 'loadedQ', 'detachedQ', 'unloadedQ'] as const) {
      expect(Math.abs((wide[0][key] as number) / (narrow[0][key] as number) - 1)).toBeLessThan(1e-8); // prettier-ignore
    }
    expect(Math.abs((wide[0].resonanceHz as number) / 455e3 - 1)).toBeLessThan(0.01);
  });
});
