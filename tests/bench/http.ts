/**
 * HTTP throughput of a signed-in read (a benchmark, not a test): autocannon against a running
 * server on loopback, GET /api/rooms with 200 connections for 20 s, one signed-in session.
 * Goal: at least 1,000 requests/s with p95 below 250 ms on a quiet machine.
 * Usage: BENCH_URL=http://127.0.0.1:4300 [BENCH_EMAIL=... BENCH_PASSWORD=...] npm run bench:http
 * (defaults: the demo facilitator of `npm run db:seed`; BENCH_CONNECTIONS, BENCH_SECONDS, BENCH_PATH).
 */
import autocannon from 'autocannon';
import { TestClient } from '../support/http-client';

const url = process.env['BENCH_URL'] ?? `http://127.0.0.1:${process.env['PORT'] ?? 4300}`;
const email = process.env['BENCH_EMAIL'] ?? 'facilitator@ripplehall.local';
const password = process.env['BENCH_PASSWORD'] ?? 'facilitate-demo-2026';
const connections = Number(process.env['BENCH_CONNECTIONS'] ?? 200);
const duration = Number(process.env['BENCH_SECONDS'] ?? 20);
const path = process.env['BENCH_PATH'] ?? '/api/rooms';

const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] ?? NaN;

async function main() {
  const client = new TestClient(url);
  try {
    await client.signIn(email, password);
  } catch (e) {
    console.error(
      `Cannot sign in at ${url} as ${email}: ${(e as Error).message}. Start the server (npm start) or set BENCH_URL / BENCH_EMAIL / BENCH_PASSWORD.`,
    );
    process.exit(2);
  }
  const first = await client.get(path);
  if (first.status !== 200) throw new Error(`GET ${path} answered ${first.status}`);
  const latencies: number[] = [];
  const statuses = new Map<number, number>();
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon({ url: url + path, connections, duration, headers: { cookie: client.cookieHeader() } }, (err, r) =>
      err ? reject(err instanceof Error ? err : new Error(String(err))) : resolve(r),
    );
    instance.on('response', (_c, status: number, _bytes: number, ms: number) => {
      latencies.push(ms);
      statuses.set(status, (statuses.get(status) ?? 0) + 1);
    });
  });
  latencies.sort((a, b) => a - b);
  const rps = latencies.length / duration;
  const p95 = percentile(latencies, 95);
  console.log(`GET ${path}, ${connections} connections, ${duration} s against ${url}`);
  console.log(`  requests/s: ${rps.toFixed(0)} (goal >= 1000)`);
  console.log(
    `  latency p50 ${percentile(latencies, 50).toFixed(0)} ms, p95 ${p95.toFixed(0)} ms (goal < 250), p99 ${percentile(latencies, 99).toFixed(0)} ms`,
  );
  console.log(
    `  statuses: ${[...statuses].map(([s, n]) => `${s} x${n}`).join(', ')}; errors ${result.errors}, timeouts ${result.timeouts}`,
  );
}

await main();
