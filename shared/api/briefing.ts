/** The printable briefing sheet of a plan: GET /api/plans/:planId/briefing (also .csv and .pdf). */
import type { PlanStarterDto } from './plans';

export interface BriefingSheet {
  planId: number;
  planName: string;
  roomName: string;
  roomVersion: number;
  stale: boolean;
  /** ISO date the sheet was produced. */
  generatedAt: string;
  minutesPerHop: number;
  starters: (PlanStarterDto & { personKey: string })[];
  people: number;
  average: number;
  averageMinutes: number;
  /** "50% will have heard within N minutes", for shares 0.5, 0.9 (and 0.99). */
  expectations: { share: number; hop: number | null; minutes: number | null; line: string }[];
  cautions: string[];
}
