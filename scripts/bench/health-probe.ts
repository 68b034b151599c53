/**
 * GET /api/health every 20 ms from a process of its own, until its standard input closes;
 * then prints the latencies (ms, one JSON array) on standard output. The API section runs it
 * beside a maximum-size analysis (scripts/bench/api.ts), so the probe's timing does not share
 * an event loop with the client reading that analysis's megabytes, as a load balancer's probe
 * would not.
 *
 * Usage: node --import tsx scripts/bench/health-probe.ts <port>
 */
import http from 'node:http';

async function probe(port: number): Promise<number[]> {
  const latencies: number[] = [];
  let stop = false;
  process.stdin.on('end', () => (stop = true));
  process.stdin.resume();
  process.stdout.write('ready\n');
  while (!stop) {
    const start = performance.now();
    await new Promise<void>((resolve, reject) => {
      const req = http.request(
        { host: '127.0.0.1', port, path: '/api/health', agent: false },
        (res) => {
          res.resume();
          res.on('end', resolve);
        },
      );
      req.on('error', reject);
      req.end();
    });
    latencies.push(performance.now() - start);
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
  return latencies;
}

if (require.main === module && /health-probe\.[cm]?[jt]s$/.test(process.argv[1] ?? '')) {
  void probe(Number(process.argv[2])).then((l) => process.stdout.write(`${JSON.stringify(l)}\n`));
}
