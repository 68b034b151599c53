/**
 * V8's `--trace-gc` lines from a server's standard output, for the API section: what the
 * event loop's garbage collector did during the judged load (how often it stopped, for how
 * long, and how much each young collection moved to the old generation). Printed beside the
 * latency figures, never judged: a collection stops the event loop, and a young collection
 * that promotes much takes long and fills the old generation, whose full collections stop
 * it again.
 *
 * A line reads, for example:
 *   [12345:0x5632a8e0]    61766 ms: Scavenge 48.4 (83.1) -> 20.1 (84.6) MB, 8.88 / 0.02 ms  (…
 * The event loop's isolate is the one that prints first: it collects while the server loads,
 * before the analysis threads exist.
 */

export interface GcEvent {
  isolate: string;
  /** ms since the isolate started. */
  at: number;
  kind: 'young' | 'full';
  /** Heap in use before and after, MB. */
  beforeMb: number;
  afterMb: number;
  /** The pause, ms. */
  pauseMs: number;
  /** Incremental marking done before a full collection's pause, ms (0 for young ones). */
  markingMs: number;
}

const LINE =
  /^\[\d+:(0x[0-9a-f]+)\]\s+(\d+) ms: (Scavenge|Mark-Compact)\S*\s+([\d.]+) \([\d.]+\) -> ([\d.]+) \([\d.]+\) MB, ([\d.]+) \/ [\d.]+ ms(?:\s+\(\+ ([\d.]+) ms in)?/;

/** The event a `--trace-gc` line reports, or undefined for any other line. */
export function parseGcLine(line: string): GcEvent | undefined {
  const m = LINE.exec(line);
  if (!m) return undefined;
  return {
    isolate: m[1],
    at: Number(m[2]),
    kind: m[3] === 'Scavenge' ? 'young' : 'full',
    beforeMb: Number(m[4]),
    afterMb: Number(m[5]),
    pauseMs: Number(m[6]),
    markingMs: m[7] ? Number(m[7]) : 0,
  };
}

/**
 * Collects the trace from a stream's chunks, keeping only the collections. V8 prints it
 * through the C library's buffered output, so a line may arrive long after its collection:
 * read a stretch of it by the isolate's clock (`sinceStart`), once the process has exited.
 */
export class GcTrace {
  readonly events: GcEvent[] = [];
  private partial = '';
  private startedAt = NaN;

  /** Call as the process is started: its isolates' clocks start then (within a few ms). */
  start(): void {
    this.startedAt = performance.now();
  }

  /** ms since `start`, on the clock the trace's lines use. */
  sinceStart(): number {
    return performance.now() - this.startedAt;
  }

  feed(chunk: string): void {
    const lines = (this.partial + chunk).split('\n');
    this.partial = lines.pop() ?? '';
    for (const line of lines) {
      const event = parseGcLine(line);
      if (event) this.events.push(event);
    }
  }

  /** The event loop's isolate (the first to print), if any collection was seen. */
  get mainIsolate(): string | undefined {
    return this.events[0]?.isolate;
  }
}

export interface GcSummary {
  young: number;
  /** Mean time between young collections, ms. */
  youngEveryMs: number;
  youngPauseMeanMs: number;
  youngPauseMaxMs: number;
  /** Mean growth of the heap in use from one young collection's end to the next's, MB. */
  promotedMbPerYoung: number;
  full: number;
  fullPauseMaxMs: number;
  /** Incremental marking of the full collections, in all, ms. */
  fullMarkingMs: number;
}

/** The collections of `isolate` from `fromMs` to `toMs` on its clock, summarised. */
export function summariseGc(
  events: readonly GcEvent[],
  isolate: string,
  fromMs = -Infinity,
  toMs = Infinity,
): GcSummary {
  const mine = events.filter((e) => e.isolate === isolate && e.at >= fromMs && e.at <= toMs);
  const young = mine.filter((e) => e.kind === 'young');
  const full = mine.filter((e) => e.kind === 'full');
  let growth = 0;
  let pairs = 0;
  for (let i = 1; i < mine.length; i++) {
    // Only between two young collections: a full one frees what the young ones promoted.
    if (mine[i].kind === 'young' && mine[i - 1].kind === 'young') {
      growth += mine[i].afterMb - mine[i - 1].afterMb;
      pairs++;
    }
  }
  const span = young.length > 1 ? young[young.length - 1].at - young[0].at : NaN;
  const mean = (xs: number[]) => (xs.length ? xs.reduce((a, b) => a + b, 0) / xs.length : NaN);
  return {
    young: young.length,
    youngEveryMs: young.length > 1 ? span / (young.length - 1) : NaN,
    youngPauseMeanMs: mean(young.map((e) => e.pauseMs)),
    youngPauseMaxMs: young.length ? Math.max(...young.map((e) => e.pauseMs)) : NaN,
    promotedMbPerYoung: pairs ? growth / pairs : NaN,
    full: full.length,
    fullPauseMaxMs: full.length ? Math.max(...full.map((e) => e.pauseMs)) : 0,
    fullMarkingMs: full.reduce((a, e) => a + e.markingMs, 0),
  };
}
