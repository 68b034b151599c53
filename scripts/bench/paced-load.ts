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
import http from 'node:http';

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
  /** This process's own CPU time (user + system), ms: it shares the machine with the server. */
  cpuMs: number;
}

function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

/** Runs the load described by `spec` and resolves with its outcome. */
export function runPacedLoad(spec: LoadSpec): Promise<LoadResult> {
  const body = readFileSync(spec.bodyFile);
  const target = new URL(spec.url);
  const agent = new http.Agent({ keepAlive: true, maxSockets: spec.connections });
  const headers = { ...spec.headers, 'content-length': String(body.length) };
  const total = Math.round(spec.rate * spec.seconds);
  const latencies: number[] = [];
  const result = { sent: 0, ok: 0, non2xx: 0, errors: 0, timeouts: 0 };
  const cpuStart = process.cpuUsage();
  const start = performance.now();
  let lastEnd = start;
  let settled = 0;

  return new Promise((resolve) => {
    const finish = () => {
      if (++settled < total) return;
      agent.destroy();
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
        cpuMs: (cpu.user + cpu.system) / 1000,
      });
    };
    const send = (due: number) => {
      result.sent++;
      let done = false;
      const end = (kind: 'ok' | 'non2xx' | 'errors' | 'timeouts') => {
        if (done) return;
        done = true;
        result[kind]++;
        lastEnd = performance.now();
        if (kind === 'ok') latencies.push(lastEnd - due);
        finish();
      };
      const req = http.request(
        {
          host: target.hostname,
          port: target.port,
          path: target.pathname + target.search,
          method: spec.method,
          headers,
          agent,
          timeout: spec.timeoutMs,
        },
        (res) => {
          res.on('data', () => {});
          res.on('end', () => end(res.statusCode! >= 200 && res.statusCode! < 300 ? 'ok' : 'non2xx')); // prettier-ignore
          res.on('error', () => end('errors'));
        },
      );
      req.on('timeout', () => {
        end('timeouts');
        req.destroy();
      });
      req.on('error', () => end('errors'));
      req.end(body);
    };
    // Sends every request already due, then sleeps until the next one is.
    let next = 0;
    const tick = () => {
      const now = performance.now();
      while (next < total && start + (next * 1000) / spec.rate <= now) {
        send(start + (next * 1000) / spec.rate);
        next++;
      }
      if (next < total) setTimeout(tick, Math.max(0, start + (next * 1000) / spec.rate - now));
    };
    tick();
  });
}

if (require.main === module && /paced-load\.[cm]?[jt]s$/.test(process.argv[1] ?? '')) {
  const spec = JSON.parse(readFileSync(process.argv[2], 'utf8')) as LoadSpec;
  void runPacedLoad(spec).then((r) => process.stdout.write(`${JSON.stringify(r)}\n`));
}
