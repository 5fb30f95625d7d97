/**
 * Clock times on the briefing sheet, one format everywhere (screen, print, PDF): 24-hour "HH:MM".
 * Plain functions shared by the client and the server.
 */

/** "H:MM" or "HH:MM", 00:00 to 23:59. */
export const CLOCK_PATTERN = /^([01]?\d|2[0-3]):([0-5]\d)$/;
export const DEFAULT_SEND_AT = '09:00';

export function clockProblem(value: string): string | null {
  return CLOCK_PATTERN.test(value.trim()) ? null : 'Enter a 24-hour time such as 09:00 or 14:30.';
}

/** Minutes after midnight of a valid time, else null. */
export function clockMinutes(value: string): number | null {
  const m = CLOCK_PATTERN.exec(value.trim());
  return m ? Number(m[1]) * 60 + Number(m[2]) : null;
}

/** Minutes after midnight as "HH:MM" (24-hour), with "+1 day" past midnight. */
export function formatClock(totalMinutes: number): string {
  const rounded = Math.round(totalMinutes);
  const day = Math.floor(rounded / (24 * 60));
  const t = ((rounded % (24 * 60)) + 24 * 60) % (24 * 60);
  const hhmm = `${String(Math.floor(t / 60)).padStart(2, '0')}:${String(t % 60).padStart(2, '0')}`;
  return day > 0 ? `${hhmm} (+${day} day${day === 1 ? '' : 's'})` : hhmm;
}

/** For each expectation with minutes: the clock time by which that share will have heard. */
export function clockTimes(
  expectations: readonly { share: number; minutes: number | null }[],
  sendAt: string,
): { share: number; at: string; line: string }[] {
  const start = clockMinutes(sendAt);
  if (start === null) return [];
  return expectations
    .filter((e) => e.minutes !== null)
    .map((e) => {
      const at = formatClock(start + e.minutes!);
      return { share: e.share, at, line: `${Math.round(e.share * 100)}% will have heard by about ${at}` };
    });
}

/** An ISO instant as "YYYY-MM-DD HH:MM UTC" (the server has no reader's time zone). */
export function formatUtc(iso: string): string {
  return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}
