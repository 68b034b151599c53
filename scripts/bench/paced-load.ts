/**
 * An open-loop load at an even pace, run as its own process by the API section
 * (scripts/bench/api.ts): request k leaves at start + k / rate, whatever became of the ones
 * before, over a pool of keep-alive connections. Each latency is counted from the moment the
 * request was due, not from when a connection was free to take it, so a server that falls
 * behind is charged for the wait (no coordinated omission).
 *
 * autocannon's `-R` is not such a pace: each connection sends its share of the second
 * (rate ÷ connections) back to back as soon as the second begins, then idles until the next
 * one, so every second starts with a burst of `connections` requests at once.
 *
 * Usage: node --import tsx scripts/bench/paced-load.ts <spec.json>; prints one JSON line
 * (LoadResult) on standard output.
 */
import { readFileSync } from 'node:fs';
import { connect, type Socket } from 'node:net';

/** What to send, how fast and for how long. */
export interface LoadSpec {
  url: string;
  method: string;
  headers: Record<string, string>;
  /** File holding the request body. */
  bodyFile: string;
  /** Requests per second, evenly spaced. */
  rate: number;
  seconds: number;
  /** Most connections open at once; a request due while all are busy waits for one. */
  connections: number;
  /** A request unanswered this long counts as a timeout, ms. */
  timeoutMs: number;
}

/** The load's outcome; latencies in ms from each request's due time to its answer's end. */
export interface LoadResult {
  sent: number;
  /** Answers with a 2xx status. */
  ok: number;
  non2xx: number;
  errors: number;
  timeouts: number;
  /** Seconds from the first request's due time to the last answer. */
  duration: number;
  latency: { p50: number; p90: number; p99: number; max: number };
  /** Each second's slowest answer (by due time: second k holds requests due in [k, k+1) s), ms. */
  worstBySecond: number[];
  /** This process's own CPU time (user + system), ms: it shares the machine with the server. */
  cpuMs: number;
}

function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

const HEADER_END = Buffer.from('\r\n\r\n');

/**
 * One keep-alive connection answering one request at a time. The request's bytes are made
 * once; an answer is read by its status line and Content-Length only, so the load costs the
 * shared cores little (Node's http client took about three times the CPU per request).
 */
class Connection {
  readonly socket: Socket;
  /** Due time of the request on the wire, or null when idle. */
  due: number | null = null;
  sentAt = 0;
  private head: Buffer | null = null;
  private bodyLeft = -1;
  private status = 0;

  constructor(
    port: number,
    host: string,
    private readonly done: (c: Connection, due: number, status: number) => void,
    private readonly failed: (c: Connection, due: number | null) => void,
  ) {
    this.socket = connect({ port, host, noDelay: true });
    this.socket.on('data', (chunk: Buffer) => this.read(chunk));
    this.socket.on('error', () => {});
    this.socket.on('close', () => this.failed(this, this.due));
  }

  send(request: Buffer, due: number): void {
    this.due = due;
    this.sentAt = performance.now();
    this.head = null;
    this.bodyLeft = -1;
    this.socket.write(request);
  }

  private read(chunk: Buffer): void {
    if (this.due === null) return;
    if (this.bodyLeft < 0) {
      const head = this.head ? Buffer.concat([this.head, chunk]) : chunk;
      const end = head.indexOf(HEADER_END);
      if (end < 0) {
        this.head = head;
        return;
      }
      const text = head.toString('latin1', 0, end);
      this.status = Number(text.slice(9, 12));
      const length = /\r\ncontent-length:\s*(\d+)/i.exec(text);
      if (!length) {
        // Every answer of this server carries its length; one that does not is an error.
        this.socket.destroy();
        return;
      }
      this.head = null;
      this.bodyLeft = Number(length[1]) - (head.length - end - HEADER_END.length);
    } else {
      this.bodyLeft -= chunk.length;
    }
    if (this.bodyLeft <= 0) {
      const due = this.due;
      this.due = null;
      this.bodyLeft = -1;
      this.done(this, due, this.status);
    }
  }
}

/** Runs the load described by `spec` and resolves with its outcome. */
export function runPacedLoad(spec: LoadSpec): Promise<LoadResult> {
  const body = readFileSync(spec.bodyFile);
  const target = new URL(spec.url);
  const head =
    `${spec.method} ${target.pathname}${target.search} HTTP/1.1\r\nhost: ${target.host}\r\n` +
    Object.entries(spec.headers)
      .map(([k, v]) => `${k}: ${v}\r\n`)
      .join('') +
    `content-length: ${body.length}\r\nconnection: keep-alive\r\n\r\n`;
  const request = Buffer.concat([Buffer.from(head, 'latin1'), body]);
  const total = Math.round(spec.rate * spec.seconds);
  const latencies: number[] = [];
  const worstBySecond = new Array<number>(Math.ceil(spec.seconds)).fill(0);
  const result = { sent: 0, ok: 0, non2xx: 0, errors: 0, timeouts: 0 };
  const cpuStart = process.cpuUsage();
  const start = performance.now();
  const dueAt = (k: number) => start + (k * 1000) / spec.rate;
  const idle: Connection[] = [];
  const open = new Set<Connection>();
  /** Due times of requests waiting for a connection. */
  const waiting: number[] = [];
  let lastEnd = start;
  let settled = 0;
  let next = 0;

  return new Promise((resolve) => {
    const settle = (kind: 'ok' | 'non2xx' | 'errors' | 'timeouts', due: number) => {
      result[kind]++;
      lastEnd = performance.now();
      if (kind === 'ok') {
        const latency = lastEnd - due;
        latencies.push(latency);
        const second = Math.min(worstBySecond.length - 1, Math.floor((due - start) / 1000));
        if (latency > worstBySecond[second]) worstBySecond[second] = latency;
      }
      if (++settled < total) return;
      clearInterval(watch);
      for (const c of open) c.socket.destroy();
      latencies.sort((a, b) => a - b);
      const cpu = process.cpuUsage(cpuStart);
      resolve({
        ...result,
        duration: (lastEnd - start) / 1000,
        latency: {
          p50: percentile(latencies, 50),
          p90: percentile(latencies, 90),
          p99: percentile(latencies, 99),
          max: latencies.length ? latencies[latencies.length - 1] : NaN,
        },
        worstBySecond,
        cpuMs: (cpu.user + cpu.system) / 1000,
      });
    };
    const dispatch = (c: Connection) => {
      const due = waiting.shift();
      if (due === undefined) idle.push(c);
      else c.send(request, due);
    };
    const onDone = (c: Connection, due: number, status: number) => {
      settle(status >= 200 && status < 300 ? 'ok' : 'non2xx', due);
      dispatch(c);
    };
    const onFailed = (c: Connection, due: number | null) => {
      open.delete(c);
      const at = idle.indexOf(c);
      if (at >= 0) idle.splice(at, 1);
      if (due !== null) {
        c.due = null;
        settle(timedOut.delete(c) ? 'timeouts' : 'errors', due);
      }
      // A request waiting for a connection gets a new one.
      if (waiting.length > 0 && settled < total) fresh();
    };
    const fresh = () => {
      const c = new Connection(Number(target.port), target.hostname, onDone, onFailed);
      open.add(c);
      c.socket.once('connect', () => dispatch(c));
    };
    const timedOut = new Set<Connection>();
    const watch = setInterval(() => {
      const now = performance.now();
      for (const c of open) {
        if (c.due !== null && now - c.sentAt > spec.timeoutMs) {
          timedOut.add(c);
          c.socket.destroy();
        }
      }
    }, 100);
    // Sends every request already due, then sleeps until the next one is.
    const tick = () => {
      const now = performance.now();
      while (next < total && dueAt(next) <= now) {
        result.sent++;
        const c = idle.pop();
        if (c) c.send(request, dueAt(next));
        else {
          waiting.push(dueAt(next));
          if (open.size < spec.connections) fresh();
        }
        next++;
      }
      if (next < total) setTimeout(tick, Math.max(0, dueAt(next) - now));
    };
    tick();
  });
}

if (require.main === module && /paced-load\.[cm]?[jt]s$/.test(process.argv[1] ?? '')) {
  const spec = JSON.parse(readFileSync(process.argv[2], 'utf8')) as LoadSpec;
  void runPacedLoad(spec).then((r) => process.stdout.write(`${JSON.stringify(r)}\n`));
}
