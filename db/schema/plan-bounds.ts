import { double, index, int, json, mysqlTable, uniqueIndex, varchar } from 'drizzle-orm/mysql-core';
import type { SearchResume } from '../../shared/engine/plan-resume';
import { idColumn, refColumn, updatedAt } from './columns';
import { rooms } from './rooms';

/**
 * The best proven facts about one planning problem, shared by every plan of that problem: a room
 * version, a budget k and the constraints (who must / cannot be briefed, the no-show chance) form
 * the key. `lowerBound` is the largest proven lower bound on the best total any search, swap,
 * greedy run or supermodular check has found for the key (it only ever rises); `bestTotal` the
 * smallest total any plan of the key achieved (it only ever falls). When the two meet within
 * 1e-9 the optimum is certified, and every plan whose total equals it is proven best, whichever
 * method made it.
 */
export const planBounds = mysqlTable(
  'plan_bounds',
  {
    id: idColumn(),
    roomId: refColumn('room_id')
      .notNull()
      .references(() => rooms.id, { onDelete: 'cascade' }),
    roomVersion: int('room_version', { unsigned: true }).notNull(),
    k: int('k', { unsigned: true }).notNull(),
    /** Canonical constraints: sorted must / cannot person ids and the no-show chance (see server/plans/bound-key.ts). */
    constraintsKey: varchar('constraints_key', { length: 190 }).notNull(),
    lowerBound: double('lower_bound').notNull(),
    /** What proved the lower bound: 'search', 'supermodular', 'cover', 'single'. */
    lowerSource: varchar('lower_source', { length: 20 }).notNull(),
    bestTotal: double('best_total'),
    /** Person ids of the plan with the best total (briefing order). */
    bestStarters: json('best_starters').$type<number[]>(),
    /**
     * Where the branch and bound of this key stopped (open pieces, the path inside each, best set
     * and counts over every run; shared/engine/plan-resume.ts), so the next search continues
     * from there; a finished search leaves nothing open. Engine indices of the room version.
     */
    searchState: json('search_state').$type<SearchResume>(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex('plan_bounds_key_uq').on(t.roomId, t.roomVersion, t.k, t.constraintsKey), index('plan_bounds_room_idx').on(t.roomId)],
);
