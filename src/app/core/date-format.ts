import { formatDate } from '@angular/common';
import { Pipe, type PipeTransform } from '@angular/core';

/**
 * One way to write dates everywhere: "2 Dec 2026" for a day, "2 Dec 2026, 04:32" for a moment
 * (24-hour clock, the browser's time zone). Calendar days (YYYY-MM-DD, a session date) are read
 * as that day, never shifted by the time zone.
 */
export const DAY_FORMAT = 'd MMM y';
export const DATE_TIME_FORMAT = 'd MMM y, HH:mm';

type When = string | number | Date | null | undefined;
const CALENDAR_DAY = /^\d{4}-\d{2}-\d{2}$/;

export function formatDay(value: When): string {
  if (value === null || value === undefined || value === '') return '';
  if (typeof value === 'string' && CALENDAR_DAY.test(value)) return formatDate(value, DAY_FORMAT, 'en', 'UTC');
  return formatDate(value, DAY_FORMAT, 'en');
}

export function formatDateTime(value: When): string {
  if (value === null || value === undefined || value === '') return '';
  return formatDate(value, DATE_TIME_FORMAT, 'en');
}

/** `{{ x | day }}` → "2 Dec 2026". */
@Pipe({ name: 'day' })
export class DayPipe implements PipeTransform {
  transform(value: When): string {
    return formatDay(value);
  }
}

/** `{{ x | dateTime }}` → "2 Dec 2026, 04:32". */
@Pipe({ name: 'dateTime' })
export class DateTimePipe implements PipeTransform {
  transform(value: When): string {
    return formatDateTime(value);
  }
}
