/**
 * End-to-end speed of the plans API against a running server (a benchmark, not a test):
 *   1. a greedy plan for 300 people, k = 10: POST to the full response (per person, reach curve);
 *   2. a rehearsal of 10,000 cascades on those 300 people: POST, SSE until done, GET the stored results.
 * Usage: BENCH_URL=http://127.0.0.1:4440 BENCH_EMAIL=... BENCH_PASSWORD=... npx tsx tests/bench/plans-http.ts
 * (defaults: the demo admin account of `npm run db:seed`). Prints medians.
 */
import { TestClient } from '../support/http-client';
import { makeRoom, readEvents, ringRoom } from '../server/plans-support';

const url = process.env['BENCH_URL'] ?? 'http://127.0.0.1:4440';
const email = process.env['BENCH_EMAIL'] ?? 'admin@ripplehall.local';
const password = process.env['BENCH_PASSWORD'] ?? 'admin-demo-2026';
const planReps = Number(process.env['BENCH_PLAN_REPS'] ?? 15);
const rehearsalReps = Number(process.env['BENCH_REHEARSAL_REPS'] ?? 5);

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const ms = (x: number) => `${x.toFixed(1)} ms`;

async function main() {
  const client = new TestClient(url);
  try {
    await client.signIn(email, password);
  } catch (e) {
    console.error(
      `Cannot sign in at ${url} as ${email}: ${(e as Error).message}\nStart the server and load the demo data (npm run db:seed), or set BENCH_EMAIL / BENCH_PASSWORD.`,
    );
    process.exit(2);
  }
  const graph = ringRoom(300, 1200, 42);
  const room = await makeRoom(client, graph, `Benchmark room ${new Date().toISOString()}`);
  console.log(`room ${room.id}: ${graph.ids.length} people, ${graph.ties.length} ties`);

  // Warm-up (worker threads, JIT).
  await client.post(`/api/rooms/${room.id}/plans`, { k: 10, method: 'greedy', name: 'warm-up' });
  const planTimes: number[] = [];
  const engineTimes: number[] = [];
  const getTimes: number[] = [];
  let planId = 0;
  for (let i = 0; i < planReps; i++) {
    const t = performance.now();
    const r = await client.post(`/api/rooms/${room.id}/plans`, { k: 10, method: 'greedy', name: `bench ${i}` });
    planTimes.push(performance.now() - t);
    if (r.status !== 201) throw new Error(`plan failed: ${r.status} ${r.text}`);
    engineTimes.push(r.body.elapsedMs);
    planId = r.body.id;
    const g = performance.now();
    await client.get(`/api/plans/${planId}`);
    getTimes.push(performance.now() - g);
  }

  const rehearsalTimes: number[] = [];
  const simTimes: number[] = [];
  for (let i = -1; i < rehearsalReps; i++) {
    const t = performance.now();
    const start = await client.post(`/api/plans/${planId}/rehearsals`, { runs: 10000, seed: `bench-${Date.now()}-${i}` });
    if (start.status !== 202) throw new Error(`rehearsal failed: ${start.status} ${start.text}`);
    const { events } = await readEvents(client, `/api/rehearsals/${start.body.rehearsal.id}/events`);
    if (events.at(-1)?.type !== 'done') throw new Error(`rehearsal ended ${events.at(-1)?.type}`);
    const d = await client.get(`/api/rehearsals/${start.body.rehearsal.id}`);
    if (i < 0) continue; // warm-up
    rehearsalTimes.push(performance.now() - t);
    simTimes.push(d.body.elapsedMs);
  }

  console.log('');
  console.log('case                                              median        target');
  console.log(`greedy plan, n = 300, k = 10 (POST -> response)    ${ms(median(planTimes)).padEnd(12)}  < 300 ms end to end`);
  console.log(`  of which the engine in the worker                ${ms(median(engineTimes))}`);
  console.log(`  GET the stored plan with per person + curve      ${ms(median(getTimes))}`);
  console.log(`rehearsal 10,000 cascades, n = 300, k = 10         ${ms(median(rehearsalTimes)).padEnd(12)}  < 3 s finished and stored`);
  console.log(`  (POST, SSE to done, GET results)`);
  console.log(`  of which the simulation in the pool              ${ms(median(simTimes))}`);
  console.log(`(${planReps} plans, ${rehearsalReps} rehearsals after one warm-up each)`);
  await client.delete(`/api/rooms/${room.id}`);
}

await main();
