/**
 * Rooms API contract shared by the client and the server: DTOs, limits and defaults.
 * No Node or DOM imports here. All routes live under /api/rooms.
 *
 *   GET    /api/rooms?q&sort&direction&page&pageSize&scope      -> Page<RoomListItem>
 *   POST   /api/rooms                    CreateRoomRequest      -> RoomDto (201)
 *   GET    /api/rooms/:id                                       -> RoomDto
 *   PATCH  /api/rooms/:id                UpdateRoomRequest      -> RoomDto (409 StaleVersionDetails when stale)
 *   DELETE /api/rooms/:id                (owner)                -> 204
 *   POST   /api/rooms/:id/duplicate      { name? }              -> RoomDto (201, owned by the caller)
 *   POST   /api/rooms/:id/edits          RoomEditBatch          -> RoomEditResult
 *   GET    /api/rooms/:id/people?q&group&sort&direction&page&pageSize -> Page<PersonDto>
 *   GET    /api/rooms/:id/ties?q&personId&sort&direction&page&pageSize -> Page<TieListItem>
 *   GET    /api/rooms/:id/summary                               -> RoomSummary
 *   POST   /api/rooms/:id/import?dryRun=true|false   multipart (see ImportFields) -> ImportReport
 *   POST   /api/rooms/import?dryRun=true|false       multipart, creates a room   -> ImportReport
 *   GET    /api/rooms/:id/export?format=json|graphml|people-csv|ties-csv        -> file download
 *   GET    /api/rooms/:id/shares         (owner)                -> ShareDto[]
 *   POST   /api/rooms/:id/shares         (owner) ShareRequest   -> ShareDto (201; e-mails the person)
 *   PATCH  /api/rooms/:id/shares/:userId (owner) { role }       -> ShareDto
 *   DELETE /api/rooms/:id/shares/:userId (owner)                -> 204
 *
 * Versions: every content change (people, ties, settings, name) needs the room's current
 * `version` and bumps it; a stale one gets 409 with StaleVersionDetails. Pure layout
 * changes (a batch of only `movePeople` ops) neither need nor bump the version: layout does
 * not change the analysis, so a colleague dragging people never causes a 409 for you.
 */

import type { PageQuery } from './lists';

export const ROOM_LIMITS = {
  maxPeople: 3000,
  maxTies: 60000,
  /** Tie strength is "how often"; larger values are almost always a unit or typing mistake. */
  maxStrength: 1_000_000,
  roomNameMax: 120,
  descriptionMax: 2000,
  personNameMax: 120,
  personKeyMax: 64,
  groupMax: 60,
  emailMax: 254,
  /** Ops in one edit batch: small enough that one batch holds its locks for well under a second. */
  maxOpsPerBatch: 2000,
  /** Upload size limit for one import file. */
  maxUploadBytes: 8 * 1024 * 1024,
} as const;

export const SETTINGS_LIMITS = {
  minutesPerHop: { min: 0.1, max: 1440 },
  laziness: { min: 0, max: 0.95 },
  mixing: { min: 0, max: 0.5 },
} as const;

export interface RoomSettings {
  /** true: a tie reads "source asks target"; false: people ask each other both ways. */
  directed: boolean;
  /** Clock time one hop takes, to turn expected hops into minutes. */
  minutesPerHop: number;
  /** Chance a person waits a step instead of asking (0 <= laziness < 1). */
  laziness: number;
  /** Chance a person asks someone at random instead of along a tie (0 <= mixing < 1). */
  mixing: number;
}

export const DEFAULT_ROOM_SETTINGS: RoomSettings = { directed: false, minutesPerHop: 5, laziness: 0, mixing: 0 };

export type RoomAccess = 'owner' | 'editor' | 'viewer';
/** Also the database's enum (db/schema/rooms.ts). */
export const SHARE_ROLES = ['editor', 'viewer'] as const;
export type ShareRole = (typeof SHARE_ROLES)[number];

export interface RoomListItem {
  id: number;
  name: string;
  description: string;
  access: RoomAccess;
  ownerName: string;
  people: number;
  ties: number;
  version: number;
  /** ISO 8601. */
  updatedAt: string;
}

export interface PersonDto {
  id: number;
  /** The stable id used in files (import and export). Unique in the room. */
  key: string;
  name: string;
  group: string | null;
  email: string | null;
  x: number | null;
  y: number | null;
  pinned: boolean;
}

export interface TieDto {
  id: number;
  sourceId: number;
  targetId: number;
  strength: number;
}

/** A tie row of the ties table, with the names of both people. */
export interface TieListItem extends TieDto {
  sourceName: string;
  targetName: string;
}

export interface RoomDto {
  id: number;
  name: string;
  description: string;
  settings: RoomSettings;
  version: number;
  access: RoomAccess;
  ownerName: string;
  /** In the room's stable order (the engine's person order). */
  people: PersonDto[];
  ties: TieDto[];
  updatedAt: string;
}

/** A person as sent when creating a room or adding one. `key` defaults to a generated one. */
export interface NewPerson {
  key?: string;
  name: string;
  group?: string | null;
  email?: string | null;
  x?: number | null;
  y?: number | null;
  pinned?: boolean;
}

/** Ties of a new room name their people by key. */
export interface NewRoomTie {
  source: string;
  target: string;
  strength?: number;
}

export interface CreateRoomRequest {
  name: string;
  description?: string;
  settings?: Partial<RoomSettings>;
  people?: NewPerson[];
  ties?: NewRoomTie[];
}

export interface UpdateRoomRequest {
  version: number;
  name?: string;
  description?: string;
  settings?: Partial<RoomSettings>;
}

/** 409 `details` when a save meets a newer version: the client keeps the user's change and may re-apply it. */
export interface StaleVersionDetails {
  currentVersion: number;
  yourVersion: number;
  /** "changed elsewhere: reload or keep yours" */
  message: string;
  /** The stored name, description and settings now (PATCH only), to show beside the user's change. */
  current?: { name: string; description: string; settings: RoomSettings };
}
export const STALE_MESSAGE = 'This room was changed elsewhere: reload or keep yours.';

/** In edit ops a person is its id (number) or, for one added in the same batch, its tempId (string). */
export type PersonRef = number | string;

export type RoomEditOp =
  | ({ op: 'addPerson'; tempId: string } & NewPerson)
  | ({ op: 'updatePerson'; id: number } & Partial<NewPerson>)
  | { op: 'deletePerson'; id: number }
  | { op: 'addTie'; tempId?: string; source: PersonRef; target: PersonRef; strength: number }
  | { op: 'updateTie'; id: number; strength: number }
  | { op: 'deleteTie'; id: number }
  | { op: 'movePeople'; moves: { id: PersonRef; x: number; y: number; pinned?: boolean }[] };

export type RoomEditOpName = RoomEditOp['op'];

export interface RoomEditBatch {
  /** Required unless every op is `movePeople` (layout only). */
  version?: number;
  ops: RoomEditOp[];
}

export interface RoomEditResult {
  version: number;
  /** True when the batch only moved people: the version was not checked nor bumped. */
  layoutOnly: boolean;
  /** tempId -> new id. */
  people: Record<string, number>;
  ties: Record<string, number>;
}

// ---- import ----

export type ImportFormat = 'csv' | 'graphml' | 'json';

/**
 * Multipart fields of an import: `file` (GraphML, node-link JSON, or the ties CSV), optional
 * `people` (people CSV), `format` (optional; else read from the file name), `directed`
 * ('true'/'false', CSV only), `version` (import into an existing room), `name` (new room).
 */
export interface ImportFields {
  format?: ImportFormat;
  directed?: 'true' | 'false';
  version?: string;
  name?: string;
}

export interface ImportIssue {
  severity: 'error' | 'warning';
  code: string;
  message: string;
  /** 'ties' or 'people' for CSV, else the format name. */
  file?: string;
  line?: number;
  element?: string;
  field?: string;
}

/**
 * A dry run of a readable file answers 200 with the report (warnings included). A file with
 * errors, dry run or commit, saves nothing and answers 400
 * `{ error: { code: 'import_errors', message, details: { report: ImportReport } } }`, where
 * message is the one line (at most 300 characters) the command line prints for the same file;
 * a stale `version` answers 409; a file over the limit 413; a wrong file type 415.
 */
export interface ImportReport {
  format: ImportFormat;
  dryRun: boolean;
  /** True when the content was saved (never with errors). */
  committed: boolean;
  counts: { people: number; ties: number; groups: number };
  /** What an import into an existing room replaces. */
  replaces?: { people: number; ties: number };
  directed: boolean;
  warnings: ImportIssue[];
  errors: ImportIssue[];
  /** Set when committed. */
  roomId?: number;
  version?: number;
}

export const EXPORT_FORMATS = ['json', 'graphml', 'people-csv', 'ties-csv', 'org-chart-csv'] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

// ---- sharing ----

export interface ShareRequest {
  email: string;
  role: ShareRole;
}

export interface ShareDto {
  userId: number;
  email: string;
  name: string;
  role: ShareRole;
  createdAt: string;
  /** On create: whether the notification e-mail went out. */
  notified?: boolean;
}

// ---- summary ----

export interface PersonRefDto {
  id: number;
  name: string;
}

export interface RoomGroupProblem {
  kind: 'cannot-enter' | 'cannot-leave' | 'separate-part';
  /** Up to 12 people named; `size` counts all. */
  people: PersonRefDto[];
  size: number;
  message: string;
}

export interface RoomSummary {
  version: number;
  people: number;
  ties: number;
  groups: number;
  /** Ties over possible ties (n(n-1)/2 undirected, n(n-1) directed). */
  density: number;
  /** Connected parts, ignoring direction. */
  connectedParts: number;
  isolated: PersonRefDto[];
  problems: RoomGroupProblem[];
  /** Fewest starters that can reach everyone (one per closed group of the walk). */
  minStarters: number;
  hint: RoomHint | null;
  /** Why there is no hint, or what was capped. */
  notes: string[];
}

export interface RoomHint {
  starter: PersonRefDto;
  /** Room average (expected hops to hear) with that one starter. */
  average: number;
  minutes: number;
  message: string;
}

// ---- lists (the query and answer shapes are in ./lists.ts) ----

// Kept so code that still imports these from here compiles; new code imports ./lists.
export type { Page, PageQuery, SortDirection } from './lists';

export const ROOM_SORTS = ['name', 'updatedAt', 'people', 'ties'] as const;
export const PEOPLE_SORTS = ['order', 'name', 'key', 'group', 'email'] as const;
export const TIE_SORTS = ['source', 'target', 'strength'] as const;
export type RoomSort = (typeof ROOM_SORTS)[number];
export type PeopleSort = (typeof PEOPLE_SORTS)[number];
export type TieSort = (typeof TIE_SORTS)[number];

export interface RoomListQuery extends PageQuery<RoomSort> {
  scope?: 'all' | 'mine' | 'shared';
}
export interface PeopleQuery extends PageQuery<PeopleSort> {
  group?: string;
}
export interface TiesQuery extends PageQuery<TieSort> {
  /** Only ties touching this person. */
  personId?: number;
}
