import { describe, expect, it } from 'vitest';
import { calendarDay, inZone } from './firm-time';

// Expected strings are ECMA-402 Intl.DateTimeFormat en-US output with the IANA tz database
// (America/Denver: UTC-6 in summer time, UTC-7 in winter).
describe('firm time', () => {
	const instant = new Date('2027-05-14T15:30:00Z');
	it('shows an instant in the firm’s zone, not the server’s', () => {
		expect(inZone(instant, 'America/Denver', 'time')).toBe('9:30 AM MDT');
		expect(inZone(instant, 'America/Denver', 'dayLong')).toBe('Friday, May 14, 2027');
		expect(inZone(instant, 'America/Denver', 'whenShort')).toBe('Fri, May 14, 9:30 AM MDT');
		expect(inZone(instant, 'America/Denver', 'dateTime')).toBe('May 14, 2027 at 9:30 AM');
	});
	it('moves to the day the zone is in: late evening in Denver is already tomorrow in UTC', () => {
		const evening = new Date('2027-05-15T03:00:00Z');
		expect(inZone(evening, 'America/Denver', 'date')).toBe('May 14, 2027');
		expect(inZone(evening, 'UTC', 'date')).toBe('May 15, 2027');
		// The office's tables: an acceptance at 9 PM in Denver is dated that day, not the next.
		expect(inZone(evening, 'America/Denver', 'numericDay')).toBe('5/14/2027');
		expect(inZone(evening, 'America/Denver', 'numericWhen')).toBe('5/14/2027, 9:00 PM');
	});
	it('reads a calendar day as the date it names, whatever the zone', () => {
		expect(calendarDay('2027-05-14')).toBe('Fri, May 14');
		expect(calendarDay('2027-05-14', 'dayMedium')).toBe('Fri, May 14, 2027');
		expect(calendarDay('2027-01-01', 'dayLong')).toBe('Friday, January 1, 2027');
	});
});
