/** Workshops API: DTOs and validation constants shared by client and server. */

export const WORKSHOP_STATUSES = ['draft', 'collecting', 'running', 'debrief', 'closed'] as const;
export type WorkshopStatus = (typeof WORKSHOP_STATUSES)[number];

export const STATUS_LABELS: Record<WorkshopStatus, string> = {
  draft: 'Draft',
  collecting: 'Collecting answers',
  running: 'Running',
  debrief: 'Debrief',
  closed: 'Closed',
};

/** Allowed moves; anything else is refused with a 409 saying why. */
export const STATUS_MOVES: Record<WorkshopStatus, readonly WorkshopStatus[]> = {
  draft: ['collecting', 'closed'],
  collecting: ['running', 'closed'],
  running: ['collecting', 'debrief', 'closed'],
  debrief: ['running', 'closed'],
  closed: [],
};

/** How often a participant talks to someone they named; each level is a tie strength. */
export const SURVEY_LEVELS = [
  { value: 'often', label: 'Most days', strength: 3 },
  { value: 'weekly', label: 'About once a week', strength: 2 },
  { value: 'sometimes', label: 'Now and then', strength: 1 },
] as const;
export type SurveyLevel = (typeof SURVEY_LEVELS)[number]['value'];
export const SURVEY_LEVEL_VALUES = SURVEY_LEVELS.map((l) => l.value) as [SurveyLevel, ...SurveyLevel[]];
export const strengthOf = (level: SurveyLevel): number => SURVEY_LEVELS.find((l) => l.value === level)!.strength;

export const NOMINATION_LIMIT_MAX = 20;
export const TITLE_MAX = 160;
export const NAME_MAX = 120;
export const ROSTER_MAX = 2000;

/** How nominations (directed: "I ask them") become ties when the room is built. */
export const BUILD_MODES = [
  { value: 'directed', label: 'Keep directed', hint: 'A tie from each person to everyone they named.' },
  { value: 'reciprocated', label: 'Only mutual', hint: 'An undirected tie only where both named each other.' },
  { value: 'either', label: 'Either direction', hint: 'An undirected tie where at least one named the other.' },
] as const;
export type BuildMode = (typeof BUILD_MODES)[number]['value'];

export interface Facilitator {
  id: number;
  name: string;
  email: string;
  owner: boolean;
}

export interface WorkshopSummary {
  id: number;
  title: string;
  sessionDate: string;
  status: WorkshopStatus;
  roomId: number | null;
  roomName: string | null;
  participants: number;
  answered: number;
  owner: boolean;
}

export interface ParticipantRow {
  id: number;
  name: string;
  email: string | null;
  personId: string | null;
  claimed: boolean;
  answered: boolean;
  answeredAt: string | null;
  activeLinks: number;
  lastLinkUse: string | null;
  /** When the participant's live link stops working (null: no live link). */
  linkExpiresAt: string | null;
}

export interface DebriefSettings {
  rehearsalId: number;
  sampleRun: number;
  releasedAt: string;
}

export interface WorkshopDetail extends Omit<WorkshopSummary, 'participants' | 'answered'> {
  nominationLimit: number;
  linkDays: number;
  showStarters: boolean;
  facilitators: Facilitator[];
  participants: ParticipantRow[];
  nextStatuses: WorkshopStatus[];
  debrief: DebriefSettings | null;
  joinCodeActive: boolean;
}

export interface NewWorkshop {
  title: string;
  sessionDate: string;
  /** An existing room, or null to start a new empty room from the survey. */
  roomId: number | null;
  nominationLimit?: number;
}

/** A participant's own link as printed or reissued (the same link each time until it is reissued). */
export interface IssuedLink {
  participantId: number;
  name: string;
  email: string | null;
  url: string;
  expiresAt: string;
  qr: string;
}

export interface SurveyProgress {
  status: WorkshopStatus;
  participants: number;
  answered: number;
  consented: number;
  updatedAt: string | null;
}

export interface MissingAnswer {
  participantId: number;
  name: string;
  nominatedBy: number;
  meaning: string;
}

export interface BuildResult {
  roomId: number;
  people: number;
  ties: number;
  mode: BuildMode;
  missing: MissingAnswer[];
}

/* ---------- participant side ---------- */

export interface Nomination {
  participantId: number;
  level: SurveyLevel;
}

/**
 * The id of the JSON data block in which the server writes a participant page's first survey
 * state (server/participants/first-page.ts); the app reads it once (participant/first-state.ts).
 */
export const FIRST_STATE_ID = 'rh-first-state';

export interface SurveyState {
  workshopTitle: string;
  sessionDate: string;
  facilitatorNames: string[];
  me: { id: number; name: string };
  status: WorkshopStatus;
  open: boolean;
  nominationLimit: number;
  names: { id: number; name: string }[];
  consented: boolean;
  version: number;
  nominations: Nomination[];
  savedAt: string | null;
  /** The saved answer is "I talk to nobody here regularly". */
  nobody: boolean;
  debriefReady: boolean;
}

export interface SurveySave {
  version: number;
  nominations: Nomination[];
  /** Required (true) when nominations is empty. */
  nobody?: boolean;
}

export interface MyDebrief {
  name: string;
  workshopTitle: string;
  inMap: boolean;
  starter: boolean;
  expectedHops: number | null;
  heardAtHop: number | null;
  minutesPerHop: number | null;
  roomAverage: number | null;
  /** reachCurve[t] = share of the room (0..1) that has heard by hop t. */
  reachCurve: number[];
  /** In the replayed cascade: how many had heard by each hop. */
  replayReached: number[];
  peopleInMap: number;
  starters: string[] | null;
  seed: string;
}

export interface JoinState {
  workshopTitle: string;
  open: boolean;
  status: WorkshopStatus;
  names: { id: number; name: string; taken: boolean }[];
}

/** The same answer for an expired, revoked or made-up link. */
export const LINK_INVALID_MESSAGE = 'This link does not work (it may have expired or been replaced). Ask your facilitator for a new one.';
