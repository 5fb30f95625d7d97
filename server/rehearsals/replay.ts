/** Sample cascades for the projector replay: the people (with their current map positions) and each stored cascade. */
import type { ReplayBundle, ReplayIndex, ReplaySample } from '../../shared/api/plans';
import { itemAt } from '../../shared/checked';
import { notFound } from '../core/http-error';
import { parseSnapshot } from '../plans/dto';
import { personAt } from '../plans/snapshot';
import { findPlan } from '../plans/service';
import { planError } from '../plans/validate';
import type { StoredSample } from './results';
import type { LoadedRehearsal } from './service';
import { personPositions } from './store';

function samplesOf(row: LoadedRehearsal): StoredSample[] {
  if (row.job.status !== 'done' || !row.rehearsal.samples)
    throw planError('not_ready', 'This rehearsal has not finished: its sample cascades are not available.');
  return JSON.parse(row.rehearsal.samples) as StoredSample[];
}

export async function replayIndex(row: LoadedRehearsal): Promise<ReplayIndex> {
  const samples = samplesOf(row);
  const plan = (await findPlan(row.rehearsal.planId))!;
  return indexOf(row, plan, parseSnapshot(plan), samples, await personPositions(plan.roomId));
}

type PlanRow = NonNullable<Awaited<ReturnType<typeof findPlan>>>;

type Snapshot = ReturnType<typeof parseSnapshot>;

function indexOf(
  row: LoadedRehearsal,
  plan: PlanRow,
  snap: Snapshot,
  samples: StoredSample[],
  at: { id: number; x: number | null; y: number | null }[],
): ReplayIndex {
  const positions = new Map(at.map((p) => [p.id, p]));
  const starters = (plan.starters ?? []).map((s) => s.personId);
  const isStarter = new Set(starters);
  return {
    rehearsalId: row.rehearsal.id,
    seed: row.rehearsal.seed,
    runs: row.rehearsal.runs,
    minutesPerHop: snap.settings.minutesPerHop,
    starters,
    people: snap.personIds.map((personId, index) => ({
      index,
      personId,
      name: personAt(snap, index).name,
      group: personAt(snap, index).group,
      x: positions.get(personId)?.x ?? null,
      y: positions.get(personId)?.y ?? null,
      starter: isStarter.has(personId),
    })),
    ties: snap.graph.ties.map((t) => ({ source: t.source, target: t.target, strength: t.strength })),
    directed: snap.graph.directed,
    samples: samples.map((s, n) => ({ n, run: s.run })),
  };
}

export async function replaySample(row: LoadedRehearsal, rawN: string): Promise<ReplaySample> {
  const samples = samplesOf(row);
  const n = /^\d{1,4}$/.test(rawN) ? Number(rawN) : NaN;
  const s = samples[n];
  if (!s) throw notFound(`Sample ${rawN}`);
  const plan = (await findPlan(row.rehearsal.planId))!;
  return sampleOf(row, plan, parseSnapshot(plan), s, n);
}

/**
 * The index and every sample in one answer, the plan and positions read once: the replay's first
 * frame waits for one request instead of the index and then its samples.
 */
export async function replayBundle(row: LoadedRehearsal): Promise<ReplayBundle> {
  const samples = samplesOf(row);
  const plan = (await findPlan(row.rehearsal.planId))!;
  const snap = parseSnapshot(plan);
  const index = indexOf(row, plan, snap, samples, await personPositions(plan.roomId));
  return { index, samples: samples.map((s, n) => sampleOf(row, plan, snap, s, n)) };
}

function sampleOf(row: LoadedRehearsal, plan: PlanRow, snap: Snapshot, s: StoredSample, n: number): ReplaySample {
  const index = new Map(snap.personIds.map((id, i) => [id, i]));
  const heardAt: (number | null)[] = snap.personIds.map(() => null);
  for (const st of plan.starters ?? []) heardAt[index.get(st.personId)!] = 0;
  const chains = s.people.map((person, q) => {
    const capped = s.capped[q] === 1;
    const hops = itemAt(s.hops, q, 'sample hops');
    if (!capped) heardAt[person] = hops;
    const path = s.path.slice(itemAt(s.pathStart, q, 'sample path start'), itemAt(s.pathStart, q + 1, 'sample path end'));
    return { person, path, hops, truncated: s.truncated[q] === 1, capped };
  });
  const lastHop = chains.reduce((m, c) => (c.capped ? m : Math.max(m, c.hops)), 0);
  return { rehearsalId: row.rehearsal.id, n, run: s.run, seed: row.rehearsal.seed, heardAt, chains, lastHop };
}
