import { boolean, double, index, int, mysqlEnum, mysqlTable, text, uniqueIndex, varchar } from 'drizzle-orm/mysql-core';
import { users } from './accounts';
import { createdAt, idColumn, refColumn, updatedAt } from './columns';
import { SHARE_ROLES } from '../../shared/api/rooms';

/** One communication map. `version` counts content changes (people, ties, settings, name). */
export const rooms = mysqlTable(
  'rooms',
  {
    id: idColumn(),
    ownerId: refColumn('owner_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    name: varchar('name', { length: 120 }).notNull(),
    description: text('description').notNull(),
    directed: boolean('directed').notNull().default(false),
    minutesPerHop: double('minutes_per_hop').notNull().default(5),
    laziness: double('laziness').notNull().default(0),
    mixing: double('mixing').notNull().default(0),
    /** Set by an org-chart import: the CSV headers (JSON), so the export writes the same file back. */
    orgChart: text('org_chart'),
    version: int('version', { unsigned: true }).notNull().default(1),
    /** People and ties in the room, kept by every content write (server/rooms/store.ts `refreshCounts`), so lists need not count. */
    peopleCount: int('people_count', { unsigned: true }).notNull().default(0),
    tiesCount: int('ties_count', { unsigned: true }).notNull().default(0),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index('rooms_owner_idx').on(t.ownerId)],
);

/** A person of a room; `personKey` is the stable id used in files, `orderIndex` the engine order. */
export const people = mysqlTable(
  'people',
  {
    id: idColumn(),
    roomId: refColumn('room_id')
      .notNull()
      .references(() => rooms.id, { onDelete: 'cascade' }),
    personKey: varchar('person_key', { length: 64 }).notNull(),
    name: varchar('name', { length: 120 }).notNull(),
    groupName: varchar('group_name', { length: 60 }),
    email: varchar('email', { length: 254 }),
    x: double('x'),
    y: double('y'),
    pinned: boolean('pinned').notNull().default(false),
    /** The person key of this person's manager, from an org-chart import (null otherwise). */
    managerKey: varchar('manager_key', { length: 64 }),
    orderIndex: int('order_index').notNull(),
  },
  (t) => [uniqueIndex('people_room_key_uq').on(t.roomId, t.personKey), index('people_room_order_idx').on(t.roomId, t.orderIndex)],
);

/** Who talks to whom; directed rooms read "source asks target". */
export const ties = mysqlTable(
  'ties',
  {
    id: idColumn(),
    roomId: refColumn('room_id')
      .notNull()
      .references(() => rooms.id, { onDelete: 'cascade' }),
    sourceId: refColumn('source_id')
      .notNull()
      .references(() => people.id, { onDelete: 'cascade' }),
    targetId: refColumn('target_id')
      .notNull()
      .references(() => people.id, { onDelete: 'cascade' }),
    strength: double('strength').notNull(),
  },
  (t) => [uniqueIndex('ties_room_pair_uq').on(t.roomId, t.sourceId, t.targetId), index('ties_target_idx').on(t.targetId)],
);

/** A room shared with another facilitator. */
export const roomShares = mysqlTable(
  'room_shares',
  {
    id: idColumn(),
    roomId: refColumn('room_id')
      .notNull()
      .references(() => rooms.id, { onDelete: 'cascade' }),
    userId: refColumn('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    role: mysqlEnum('role', SHARE_ROLES).notNull(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('room_shares_room_user_uq').on(t.roomId, t.userId), index('room_shares_user_idx').on(t.userId)],
);
