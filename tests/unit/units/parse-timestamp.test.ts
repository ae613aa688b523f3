import { describe, it, expect } from 'vitest';
import { parseTimestamp, parseDuration } from '../../../shared/units/index';

describe('parseTimestamp', () => {
  it('reads ISO 8601 and YYYY-MM-DD HH:MM:SS as UTC epoch seconds', () => {
    const expected = Date.UTC(2024, 4, 1, 10, 0, 30) / 1000; // the JavaScript Date.UTC definition (ECMA-262 §21.4.3.4)
    expect(parseTimestamp('2024-05-01 10:00:30')).toBe(expected);
    expect(parseTimestamp('2024-05-01T10:00:30')).toBe(expected);
    expect(parseTimestamp('2024-05-01T10:00:30Z')).toBe(expected);
    expect(parseTimestamp('2024/05/01 10:00:30')).toBe(expected);
    expect(parseTimestamp('2024-05-01T10:00:30.250Z')).toBeCloseTo(expected + 0.25, 6); // derived by hand: .250 s
  });
  it('applies UTC offsets', () => {
    const utc = Date.UTC(2024, 4, 1, 8, 0, 0) / 1000; // 10:00 at +02:00 is 08:00 UTC (ISO 8601-1 §5.3.4)
    expect(parseTimestamp('2024-05-01T10:00:00+02:00')).toBe(utc);
    expect(parseTimestamp('2024-05-01T10:00:00+0200')).toBe(utc);
    expect(parseTimestamp('2024-05-01T06:00:00-02:00')).toBe(utc);
  });
  it('reads a date alone as midnight', () => {
    expect(parseTimestamp('2024-05-01')).toBe(Date.UTC(2024, 4, 1) / 1000); // ECMA-262 Date.UTC
  });
  it('refuses ambiguous or impossible dates', () => {
    expect(parseTimestamp('01/05/2024 10:00')).toBeNull();
    expect(parseTimestamp('2024-02-30 10:00:00')).toBeNull();
    expect(parseTimestamp('2024-13-01')).toBeNull();
    expect(parseTimestamp('2024-05-01 25:00:00')).toBeNull();
    expect(parseTimestamp('0.65')).toBeNull();
    expect(parseTimestamp('')).toBeNull();
  });
});

describe('parseDuration', () => {
  it('reads H:MM:SS with hours past 24', () => {
    expect(parseDuration('1:30:00')).toBe(5400); // derived by hand: 3600 + 30 × 60
    expect(parseDuration('125:00:30')).toBe(450030); // derived by hand: 125 × 3600 + 30
    expect(parseDuration('0:00:01,5')).toBeCloseTo(1.5, 12); // decimal comma seconds
  });
  it('refuses other forms', () => {
    expect(parseDuration('10:00')).toBeNull();
    expect(parseDuration('1:75:00')).toBeNull();
    expect(parseDuration('abc')).toBeNull();
  });
});
