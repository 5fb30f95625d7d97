import { boolean, index, int, json, mysqlEnum, mysqlTable, primaryKey, timestamp, uniqueIndex, varchar } from 'drizzle-orm/mysql-core';
import { users } from './accounts';
import { createdAt, idColumn, refColumn, updatedAt } from './columns';
import { WORKSHOP_STATUSES } from '../../shared/api/workshops';

/**
 * A live session. room_id and debrief_rehearsal_id are plain references (no foreign key):
 * the workshop outlives a deleted room or rehearsal and then says so instead of vanishing.
 */
export const workshops = mysqlTable(
  'workshops',
  {
    id: idColumn(),
    ownerId: refColumn('owner_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    title: varchar('title', { length: 160 }).notNull(),
    /** Calendar day of the session, YYYY-MM-DD. */
    sessionDate: varchar('session_date', { length: 10 }).notNull(),
    roomId: refColumn('room_id'),
    status: mysqlEnum('status', WORKSHOP_STATUSES).notNull().default('draft'),
    nominationLimit: int('nomination_limit').notNull().default(5),
    linkDays: int('link_days').notNull().default(30),
    showStarters: boolean('show_starters').notNull().default(false),
    /** Hash of the join code behind the projector QR code (null when none is shown). */
    joinCodeHash: varchar('join_code_hash', { length: 64 }),
    joinCodeExpiresAt: timestamp('join_code_expires_at', { fsp: 3 }),
    /** What participants see once results are released (see server/workshops/debrief.ts). */
    debrief: json('debrief'),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index('workshops_owner_idx').on(t.ownerId), uniqueIndex('workshops_join_code_uq').on(t.joinCodeHash)],
);

export const workshopFacilitators = mysqlTable(
  'workshop_facilitators',
  {
    workshopId: refColumn('workshop_id')
      .notNull()
      .references(() => workshops.id, { onDelete: 'cascade' }),
    userId: refColumn('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.workshopId, t.userId] }), index('workshop_facilitators_user_idx').on(t.userId)],
);

export const workshopParticipants = mysqlTable(
  'workshop_participants',
  {
    id: idColumn(),
    workshopId: refColumn('workshop_id')
      .notNull()
      .references(() => workshops.id, { onDelete: 'cascade' }),
    name: varchar('name', { length: 120 }).notNull(),
    email: varchar('email', { length: 254 }),
    /** The room person this participant is (set when taken from the room or after building it). */
    personId: varchar('person_id', { length: 64 }),
    /** Set when someone picked this name on the join page. */
    claimedAt: timestamp('claimed_at', { fsp: 3 }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('workshop_participants_name_uq').on(t.workshopId, t.name)],
);

/**
 * Personal links. A link is found by the SHA-256 of its token; `token_sealed` keeps an
 * AES-256-GCM copy under LINK_SECRET so the same link can be printed or e-mailed again
 * (server/participants/link-seal.ts). Null on links issued before sealing existed.
 */
export const participantLinks = mysqlTable(
  'participant_links',
  {
    id: idColumn(),
    participantId: refColumn('participant_id')
      .notNull()
      .references(() => workshopParticipants.id, { onDelete: 'cascade' }),
    tokenHash: varchar('token_hash', { length: 64 }).notNull(),
    tokenSealed: varchar('token_sealed', { length: 128 }),
    channel: mysqlEnum('channel', ['email', 'sheet', 'join']).notNull(),
    expiresAt: timestamp('expires_at', { fsp: 3 }).notNull(),
    revokedAt: timestamp('revoked_at', { fsp: 3 }),
    lastUsedAt: timestamp('last_used_at', { fsp: 3 }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('participant_links_hash_uq').on(t.tokenHash), index('participant_links_participant_idx').on(t.participantId)],
);

export const surveyResponses = mysqlTable('survey_responses', {
  participantId: refColumn('participant_id')
    .primaryKey()
    .references(() => workshopParticipants.id, { onDelete: 'cascade' }),
  consentedAt: timestamp('consented_at', { fsp: 3 }).notNull(),
  /** Optimistic concurrency: a save must name the version it was based on. */
  version: int('version').notNull().default(0),
  submittedAt: timestamp('submitted_at', { fsp: 3 }),
  updatedAt: updatedAt(),
});

export const surveyNominations = mysqlTable(
  'survey_nominations',
  {
    participantId: refColumn('participant_id')
      .notNull()
      .references(() => workshopParticipants.id, { onDelete: 'cascade' }),
    nomineeId: refColumn('nominee_id')
      .notNull()
      .references(() => workshopParticipants.id, { onDelete: 'cascade' }),
    level: mysqlEnum('level', ['often', 'weekly', 'sometimes']).notNull(),
  },
  (t) => [primaryKey({ columns: [t.participantId, t.nomineeId] }), index('survey_nominations_nominee_idx').on(t.nomineeId)],
);
