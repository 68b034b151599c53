/**
 * The API under load, against the production bundle (dist/server/main.js) on loopback:
 * - throughput and latency of POST /api/analysis on the two-metre example with its sweep
 *   (2,001 points, the traces the editor asks for), 200 requests/s evenly paced for 60 s by
 *   a second process (./paced-load.ts; 10 s with --quick), after 10 s of the same load that
 *   warms the just-started server (printed, not judged), with autocannon's bursty
 *   `-R` pace printed beside it for 10 s;
 * - the answer's size on the wire (brotli or gzip, as a browser asks);
 * - /api/health latency while the largest analysis the budget allows runs, from a probe
 *   process of its own (./health-probe.ts).
 * (The first plot after opening the Plots tab is the editor section's, scripts/bench/editor.ts.)
 * Needs the database `npm start` set up (.data/dev.env) with its demo accounts; without it
 * the rows say "not measured".
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import {
  closeSync,
  existsSync,
  mkdtempSync,
  openSync,
  readFileSync,
  rmSync,
  writeFileSync,
} from 'node:fs';
import http from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { GcTrace, summariseGc } from './gc-trace';
import { median } from './measure';
import type { LoadResult, LoadSpec } from './paced-load';
import { kib, ms, verdict, type BenchSection } from './rows';

const PORT = Number(process.env.CW_BENCH_API_PORT ?? 4391);
const RATE = 200;
/** Connections the load may hold open at once. */
const CONNECTIONS = 32;
const TARGET_P99_MS = 50;
const TARGET_BYTES = 100 * 1024;
const TARGET_HEALTH_MS = 50;
/** The server's default stages × points budget (server/analysis/analysis-pool.ts). */
const MAX_STAGE_POINTS = 1_000_000;
const EDITOR = { email: 'editor@chainwright.test', password: 'demo-receiver-2026' };

interface Session {
  cookie: string;
  csrf: string;
}

interface Answer {
  status: number;
  headers: http.IncomingHttpHeaders;
  raw: Buffer;
  ms: number;
}

function call(
  method: string,
  path: string,
  body: string | undefined,
  headers: Record<string, string>,
): Promise<Answer> {
  const start = performance.now();
  return new Promise((resolve, reject) => {
    const req = http.request(
      { host: '127.0.0.1', port: PORT, path, method, headers, agent: false },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () =>
          resolve({
            status: res.statusCode ?? 0,
            headers: res.headers,
            raw: Buffer.concat(chunks),
            ms: performance.now() - start,
          }),
        );
      },
    );
    req.on('error', reject);
    req.end(body);
  });
}

const cookieOf = (a: Answer) => String(a.headers['set-cookie'] ?? '').split(';')[0];

async function signIn(): Promise<Session> {
  const csrf = await call('GET', '/api/auth/csrf', undefined, {});
  const first = cookieOf(csrf);
  const token = JSON.parse(csrf.raw.toString()).token as string;
  const body = JSON.stringify(EDITOR);
  const login = await call('POST', '/api/auth/login', body, {
    'content-type': 'application/json',
    cookie: first,
    'x-csrf-token': token,
  });
  if (login.status !== 200) {
    throw new Error(`sign-in as the demo editor failed (${login.status}); run npm start once`);
  }
  return { cookie: cookieOf(login), csrf: JSON.parse(login.raw.toString()).csrfToken };
}

function databaseUrl(root: string): string | undefined {
  if (process.env.DATABASE_URL) return process.env.DATABASE_URL;
  const file = join(root, '.data', 'dev.env');
  if (!existsSync(file)) return undefined;
  return /^DATABASE_URL=(.+)$/m.exec(readFileSync(file, 'utf8'))?.[1]?.trim();
}

async function startServer(
  root: string,
  url: string,
  gc: GcTrace,
  gcFile: string,
): Promise<ChildProcess> {
  const build = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/build-server.ts'], {
    cwd: root,
    encoding: 'utf8',
  });
  if (build.status !== 0) throw new Error(`server bundle failed: ${build.stderr}`);
  // Started as scripts/start.sh starts it (its V8 options from scripts/lib/server-v8-flags).
  const v8Flags = readFileSync(join(root, 'scripts', 'lib', 'server-v8-flags'), 'utf8')
    .split('\n')
    .map((line) => line.trim())
    .filter((line) => line && !line.startsWith('#'));
  const gcOutput = openSync(gcFile, 'w');
  gc.start();
  const server = spawn(
    process.execPath,
    // Its collections, read from its standard output (./gc-trace.ts): a line each.
    [...v8Flags, '--trace-gc', 'dist/server/main.js'],
    {
      cwd: root,
      env: { ...process.env, DATABASE_URL: url, PORT: String(PORT), CW_SIGNIN_LIMIT: '100000' },
      // Into a file, not a pipe: Node makes a pipe non-blocking, and V8's buffered trace
      // lines are dropped whenever the pipe is full (the request log fills it).
      stdio: ['ignore', gcOutput, 'pipe'],
    },
  );
  closeSync(gcOutput);
  let stderr = '';
  server.stderr?.on('data', (c: Buffer) => (stderr += c.toString()));
  const end = Date.now() + 60_000;
  while (Date.now() < end) {
    if (server.exitCode !== null) throw new Error(`the server exited: ${stderr.slice(-500)}`);
    const ok = await call('GET', '/api/health', undefined, {}).then(
      (a) => a.status === 200,
      () => false,
    );
    if (ok) return server;
    await new Promise((r) => setTimeout(r, 200));
  }
  server.kill();
  throw new Error('the server did not answer /api/health within 60 s');
}

/**
 * CPU time the process `pid` has used, all its threads, ms (Linux /proc; USER_HZ is 100 on
 * every Linux build Node supports). Unlike wall time under a paced load, CPU per analysis
 * barely moves with what else the machine is running, so it is the figure to compare
 * across runs; two idle cores then serve at most 2,000 / (CPU ms per analysis) a second.
 */
function processCpuMs(pid: number | undefined): number | undefined {
  if (!pid || !existsSync(`/proc/${pid}/stat`)) return undefined;
  const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  // utime and stime are fields 14 and 15 of the line, 12 and 13 after the name.
  return (Number(fields[11]) + Number(fields[12])) * 10;
}

function loadHeaders(session: Session, fresh: boolean): Record<string, string> {
  return {
    'content-type': 'application/json',
    cookie: session.cookie,
    'x-csrf-token': session.csrf,
    'accept-encoding': 'br, gzip',
    ...(fresh ? { 'cache-control': 'no-cache' } : {}),
  };
}

/**
 * An even pace of `RATE` requests/s for `seconds` from a second process on loopback
 * (./paced-load.ts: each latency counted from the request's due time). `fresh`: every
 * request asks for a fresh analysis (Cache-Control: no-cache), as the targets are judged;
 * without it the server may answer from its kept answers (server/analysis/answer-cache.ts).
 */
function load(
  root: string,
  session: Session,
  bodyFile: string,
  seconds: number,
  fresh: boolean,
): LoadResult {
  const spec: LoadSpec = {
    url: `http://127.0.0.1:${PORT}/api/analysis`,
    method: 'POST',
    headers: loadHeaders(session, fresh),
    bodyFile,
    rate: RATE,
    seconds,
    connections: CONNECTIONS,
    timeoutMs: 10_000,
  };
  const specFile = `${bodyFile}.${fresh ? 'fresh' : 'kept'}.load.json`;
  writeFileSync(specFile, JSON.stringify(spec));
  const run = spawnSync(
    process.execPath,
    ['--import', 'tsx', join(root, 'scripts', 'bench', 'paced-load.ts'), specFile],
    { cwd: root, encoding: 'utf8', maxBuffer: 1 << 26 },
  );
  if (run.status !== 0) throw new Error(`the paced load failed: ${run.stderr.slice(-500)}`);
  return JSON.parse(run.stdout) as LoadResult;
}

/**
 * autocannon's `-R` (as this section ran before): each of the connections sends its share
 * of every second back to back as the second begins. Printed beside the paced figures,
 * not judged: it measures bursts of `CONNECTIONS` requests at once, not a steady rate.
 */
function burstLoad(root: string, session: Session, bodyFile: string, seconds: number) {
  const cli = join(root, 'node_modules', 'autocannon', 'autocannon.js');
  const headers = Object.entries(loadHeaders(session, true)).flatMap(([k, v]) => ['-H', `${k}=${v}`]); // prettier-ignore
  // prettier-ignore
  const args = [
    cli, '-j', '-d', String(seconds), '-c', String(CONNECTIONS), '-R', String(RATE), '-m', 'POST',
    ...headers, '-i', bodyFile, `http://127.0.0.1:${PORT}/api/analysis`,
  ];
  const run = spawnSync(process.execPath, args, { encoding: 'utf8', maxBuffer: 1 << 26 });
  if (run.status !== 0) throw new Error(`autocannon failed: ${run.stderr.slice(-500)}`);
  return JSON.parse(run.stdout) as {
    requests: { total: number };
    latency: { p50: number; p99: number };
    duration: number;
  };
}

/**
 * /api/health latencies while one analysis of `doc` runs: from a probe process of its own
 * (./health-probe.ts, judged), and from this process, which also reads the analysis's
 * megabytes on the same event loop (as this section measured before; printed beside).
 */
async function healthDuringBig(root: string, session: Session, body: string) {
  const probe = spawn(
    process.execPath,
    ['--import', 'tsx', join(root, 'scripts', 'bench', 'health-probe.ts'), String(PORT)],
    { cwd: root, stdio: ['pipe', 'pipe', 'inherit'] },
  );
  let output = '';
  probe.stdout!.on('data', (c: Buffer) => (output += c.toString()));
  while (!output.includes('ready\n')) {
    if (probe.exitCode !== null) throw new Error('the health probe ended before it began');
    await new Promise((r) => setTimeout(r, 10));
  }
  const latencies: number[] = [];
  let done = false;
  const big = call('POST', '/api/analysis', body, {
    'content-type': 'application/json',
    cookie: session.cookie,
    'x-csrf-token': session.csrf,
  }).finally(() => (done = true));
  while (!done) {
    latencies.push((await call('GET', '/api/health', undefined, {})).ms);
    await new Promise((r) => setTimeout(r, 20));
  }
  const ended = new Promise((r) => probe.on('exit', r));
  probe.stdin!.end();
  await ended;
  const probed = JSON.parse(output.slice(output.indexOf('ready\n') + 6)) as number[];
  return { probed, latencies, big: await big };
}

export const apiSection: BenchSection = {
  name: 'api',
  async run(ctx) {
    const url = databaseUrl(ctx.root);
    if (!url) return ctx.row('API', 'not measured: no database (run npm start once)', '—');
    const doc = JSON.parse(
      readFileSync(join(ctx.root, 'examples', 'two-metre-coupled-preselector.chain.json'), 'utf8'),
    );
    // As the editor asks (src/app/features/editor/state/analysis-api.ts): the plotted
    // traces, the sweep packed as differences.
    const asked = { document: doc, sweep: true, traces: ['stepUp', 'zIn', 'returnLoss'] };
    const body = JSON.stringify({ ...asked, sweepPacking: 'differences' });
    const dir = mkdtempSync(join(tmpdir(), 'cw-bench-api-'));
    const bodyFile = join(dir, 'body.json');
    writeFileSync(bodyFile, body);
    const gc = new GcTrace();
    const gcFile = join(dir, 'server-output.txt');
    let gcWindow: [number, number] | undefined;
    const server = await startServer(ctx.root, url, gc, gcFile);
    try {
      const session = await signIn();
      const ask = (text: string) =>
        call('POST', '/api/analysis', text, {
          'content-type': 'application/json',
          'accept-encoding': 'br, gzip',
          cookie: session.cookie,
          'x-csrf-token': session.csrf,
        });
      const one = await ask(body);
      if (one.status !== 200) throw new Error(`the analysis answered ${one.status}`);
      ctx.row(
        `API: answer on the wire, two-metre example, ${doc.settings.sweep.points} points, sweep as differences (${one.headers['content-encoding'] ?? 'identity'})`,
        kib(one.raw.length),
        '≤ 100 KB',
        verdict(one.raw.length <= TARGET_BYTES),
      );
      const plain = await ask(JSON.stringify(asked));
      ctx.row(
        'API: the same answer with the sweep in plain columns',
        kib(plain.raw.length),
        '(not judged)',
      );

      const seconds = ctx.quick ? 10 : 60;
      // A server that has just started runs its handlers and the engine interpreted until
      // V8 has compiled them; at this pace the queue the first seconds build can take the
      // whole run to drain. A server in use is warm, so the same load runs first to warm it,
      // printed and not judged.
      const warmSeconds = ctx.quick ? 5 : 10;
      const warm = load(ctx.root, session, bodyFile, warmSeconds, true);
      ctx.row(
        `API: warm-up just after the server's start, the same load for ${warmSeconds} s: analyses/s, p50 / p99`,
        `${(warm.ok / warm.duration).toFixed(0)}/s, ${ms(warm.latency.p50)} / ${ms(warm.latency.p99)}`,
        '(not judged)',
      );
      const cpuBefore = processCpuMs(server.pid);
      const gcFrom = gc.sinceStart();
      const r = load(ctx.root, session, bodyFile, seconds, true);
      const cpuAfter = processCpuMs(server.pid);
      gcWindow = [gcFrom, gc.sinceStart()];
      const errors = r.errors + r.timeouts + r.non2xx;
      const rate = r.ok / r.duration;
      ctx.row(
        `API: analyses/s, paced evenly at ${RATE}/s for ${seconds} s after the warm-up, each computed (no-cache)`,
        `${rate.toFixed(0)}/s`,
        `≥ ${RATE}/s`,
        verdict(rate >= RATE * 0.98 && errors === 0),
      );
      ctx.row(
        'API: latency p50 / p99 under that load',
        `${ms(r.latency.p50)} / ${ms(r.latency.p99)}`,
        `p99 ≤ ${TARGET_P99_MS} ms`,
        verdict(r.latency.p99 <= TARGET_P99_MS),
      );
      ctx.row('API: errors under that load', String(errors), '0', verdict(errors === 0));
      const slowSeconds = r.worstBySecond.filter((w) => w > TARGET_P99_MS).length;
      ctx.row(
        `API: seconds of that load with an answer slower than ${TARGET_P99_MS} ms; the slowest second's worst`,
        `${slowSeconds} of ${r.worstBySecond.length}; ${ms(Math.max(...r.worstBySecond))}`,
        '(not judged)',
      );
      if (cpuBefore !== undefined && cpuAfter !== undefined && r.sent > 0) {
        const perAnalysis = (cpuAfter - cpuBefore) / r.sent;
        ctx.row(
          'API: server CPU per analysis under that load (every thread; the database apart)',
          `${ms(perAnalysis)} → ≤ ${(2000 / perAnalysis).toFixed(0)}/s on 2 idle cores`,
          `≤ ${(2000 / RATE).toFixed(0)} ms`,
          verdict(perAnalysis <= 2000 / RATE),
        );
      }
      ctx.row(
        "API: the load process's own CPU per request (it shares the 2 cores)",
        ms(r.cpuMs / Math.max(1, r.sent)),
        '(not judged)',
      );
      // The same load answered from kept answers where the server has them: printed beside
      // the figures above, never judged (the targets are for computed analyses).
      const kept = load(ctx.root, session, bodyFile, seconds, false);
      const keptErrors = kept.errors + kept.timeouts + kept.non2xx;
      ctx.row(
        `API: the same load with the server's kept answers: analyses/s, p50 / p99, errors`,
        `${(kept.ok / kept.duration).toFixed(0)}/s, ${ms(kept.latency.p50)} / ` +
          `${ms(kept.latency.p99)}, ${keptErrors}`,
        '(not judged)',
      );
      const burstSeconds = 10;
      const burst = burstLoad(ctx.root, session, bodyFile, burstSeconds);
      ctx.row(
        `API: autocannon -c ${CONNECTIONS} -R ${RATE} for ${burstSeconds} s (each second's share sent in bursts), computed: analyses/s, p50 / p99`,
        `${(burst.requests.total / burst.duration).toFixed(0)}/s, ${ms(burst.latency.p50)} / ${ms(burst.latency.p99)}`,
        '(not judged)',
      );

      const stages = doc.stages.length;
      const points = Math.min(100_001, Math.floor(MAX_STAGE_POINTS / stages));
      const bigDoc = {
        ...doc,
        settings: { ...doc.settings, sweep: { ...doc.settings.sweep, points } },
      };
      const { probed, latencies, big } = await healthDuringBig(
        ctx.root,
        session,
        JSON.stringify({ document: bigDoc, sweep: true }),
      );
      const worst = Math.max(...probed);
      ctx.row(
        `API: /api/health during a ${stages} × ${points.toLocaleString('en')}-point analysis ` +
          `(${big.status}, ${ms(big.ms)}), probe process, median / worst of ${probed.length}`,
        `${ms(median(probed))} / ${ms(worst)}`,
        `≤ ${TARGET_HEALTH_MS} ms`,
        verdict(worst <= TARGET_HEALTH_MS),
      );
      ctx.row(
        `API: the same from the process reading the analysis, median / worst of ${latencies.length}`,
        `${ms(median(latencies))} / ${ms(Math.max(...latencies))}`,
        '(not judged)',
      );
    } finally {
      const exited = new Promise((resolve) => server.once('exit', resolve));
      server.kill('SIGTERM');
      // Its last trace lines come out as it exits.
      await Promise.race([exited, new Promise((resolve) => setTimeout(resolve, 10_000))]);
      if (existsSync(gcFile)) gc.feed(readFileSync(gcFile, 'utf8') + '\n');
      rmSync(dir, { recursive: true, force: true });
    }
    if (gcWindow && gc.mainIsolate) {
      const g = summariseGc(gc.events, gc.mainIsolate, ...gcWindow);
      ctx.row(
        "API: the event loop's garbage collection during the judged load: young collections (every, pause mean / max, heap grown per collection); full collections (count, worst pause, marking in all)",
        `${g.young} (every ${ms(g.youngEveryMs)}, ${ms(g.youngPauseMeanMs)} / ${ms(g.youngPauseMaxMs)}, ` +
          `${g.promotedMbPerYoung.toFixed(2)} MB); ${g.full} (${ms(g.fullPauseMaxMs)}, ${ms(g.fullMarkingMs)})`,
        '(not judged)',
      );
    }
  },
};
