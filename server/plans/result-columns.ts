/** A finished computation as plan columns: starters with names, scores, results, reading aids, no-show results. */
import type { StoredAbsence, StoredPlanExtras } from '../../db/schema/plans';
import type { PlanComputation, RoomSnapshot } from './compute';
import type { StoredPlanResults } from './dto';
import { personAt } from './snapshot';
import type { NewPlan } from './store';

const who = (snapshot: RoomSnapshot, i: number) => {
  const { personId, name } = personAt(snapshot, i);
  return { personId, name };
};

function starterInfo(snapshot: RoomSnapshot, indices: readonly number[]) {
  return indices.map((i) => personAt(snapshot, i));
}

export function resultColumns(snapshot: RoomSnapshot, c: PlanComputation): Partial<NewPlan> {
  const results: StoredPlanResults = { h: c.h.map((v) => (Number.isFinite(v) ? v : null)), curve: c.curve };
  return {
    status: 'ready',
    methodUsed: c.methodUsed,
    starters: starterInfo(snapshot, c.starters),
    total: c.total,
    average: c.average,
    qualityRank: c.rank,
    lowerBound: c.lowerBound,
    gap: c.gap,
    certified: c.certified,
    coverSize: c.coverSize,
    elapsedMs: c.elapsedMs,
    notes: c.notes,
    warnings: c.warnings,
    results: JSON.stringify(results),
    extras: extrasColumn(snapshot, c),
    absence: absenceColumn(snapshot, c),
    error: null,
  };
}

function extrasColumn(snapshot: RoomSnapshot, c: PlanComputation): StoredPlanExtras {
  const b = c.extras.bestSingle;
  return {
    ...c.extras,
    bestSingle: b ? { ...who(snapshot, b.person), total: b.total } : null,
  };
}

function absenceColumn(snapshot: RoomSnapshot, c: PlanComputation): StoredAbsence | null {
  const a = c.absence;
  if (!a) return null;
  return {
    expectedTotal: a.expectedTotal,
    nobodyChance: a.nobodyChance,
    worstAbsence: a.worstAbsence ? { ...who(snapshot, a.worstAbsence.person), total: a.worstAbsence.total } : null,
    standIns: a.standIns.map((s) => ({
      ...who(snapshot, s.starter),
      standInId: s.person === null ? null : personAt(snapshot, s.person).personId,
      standInName: s.person === null ? null : personAt(snapshot, s.person).name,
      total: s.total,
    })),
  };
}
