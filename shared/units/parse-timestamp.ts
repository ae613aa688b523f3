// Date-time and duration cells → seconds, so a timestamp column can be kept as numbers.

// YYYY-MM-DD or YYYY/MM/DD, then optionally T or space and HH:MM[:SS[.fff]], then optionally Z or ±HH[:]MM.
const TIMESTAMP_PATTERN =
  /^(\d{4})[-/](\d{1,2})[-/](\d{1,2})(?:[T ](\d{1,2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?)?\s*(Z|[+-]\d{2}(?::?\d{2})?)?$/i;

// Gregorian calendar (ISO 8601 uses the proleptic Gregorian calendar).
function daysInMonth(year: number, month: number): number {
  if (month === 2) return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0 ? 29 : 28;
  return month === 4 || month === 6 || month === 9 || month === 11 ? 30 : 31;
}

/**
 * Date-time text → seconds since 1970-01-01T00:00:00Z (Unix epoch).
 * Accepts ISO 8601 calendar dates with an optional time and zone (`2024-05-01T10:00:00Z`,
 * `2024-05-01T10:00:00.250+02:00`) and the common `YYYY-MM-DD HH:MM:SS` (also with `/`).
 * Text without a zone is read as UTC: only differences between rows matter for elapsed
 * time, and reading it in the machine's zone would make results depend on where the code runs.
 * Day-first or month-first dates (01/05/2024) are refused: they are ambiguous.
 * Reference: ISO 8601-1:2019 §5.2 (calendar date), §5.3 (time of day), §5.3.4 (UTC offset).
 * Cost: O(length of text).
 * @returns epoch seconds, or null when the text is not such a date-time or names an impossible date.
 * @example parseTimestamp('2024-05-01 10:00:30') // 1714557630
 */
export function parseTimestamp(text: string): number | null {
  const match = TIMESTAMP_PATTERN.exec(text.trim());
  if (match === null) return null;
  const year = Number(match[1]);
  const month = Number(match[2]);
  const day = Number(match[3]);
  const hour = match[4] === undefined ? 0 : Number(match[4]);
  const minute = match[5] === undefined ? 0 : Number(match[5]);
  const second = match[6] === undefined ? 0 : Number(match[6]);
  if (month < 1 || month > 12 || day < 1 || day > 31) return null;
  if (hour > 24 || minute > 59 || second > 60) return null;
  if (hour === 24 && (minute !== 0 || second !== 0)) return null;
  // Date.UTC rolls 2024-02-31 over into March: refuse dates that do not exist.
  if (day > daysInMonth(year, month)) return null;
  let seconds = Date.UTC(year, month - 1, day, hour, minute, second) / 1000;
  if (match[7] !== undefined) seconds += Number(`0.${match[7]}`);
  const zone = match[8];
  if (zone !== undefined && zone.toUpperCase() !== 'Z') {
    const sign = zone[0] === '-' ? -1 : 1;
    const digits = zone.slice(1).replace(':', '');
    const offsetHours = Number(digits.slice(0, 2));
    const offsetMinutes = digits.length > 2 ? Number(digits.slice(2, 4)) : 0;
    if (offsetHours > 23 || offsetMinutes > 59) return null;
    // local = UTC + offset, so UTC = local − offset
    seconds -= sign * (offsetHours * 3600 + offsetMinutes * 60);
  }
  return seconds;
}

const DURATION_PATTERN = /^(\d{1,7}):([0-5]\d):([0-5]\d(?:[.,]\d{1,9})?)$/;

/**
 * Elapsed-time text `H:MM:SS` (hours may exceed 24, e.g. `125:30:00`) → seconds.
 * Two-part `MM:SS` is refused because it cannot be told apart from `HH:MM`.
 * Reference: ISO 8601-1:2019 §5.3.1.2 extended time format, used here as a duration.
 * Cost: O(length of text).
 * @returns seconds, or null when the text is not of that form.
 * @example parseDuration('1:30:00') // 5400
 */
export function parseDuration(text: string): number | null {
  const match = DURATION_PATTERN.exec(text.trim());
  if (match === null) return null;
  return Number(match[1]) * 3600 + Number(match[2]) * 60 + Number(match[3].replace(',', '.'));
}
