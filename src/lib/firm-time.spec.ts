import { describe, expect, it } from 'vitest';
import { calendarDay, inZone, whenWriter } from './firm-time';

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
	// The reference is the platform's Intl.DateTimeFormat (ICU's time-zone data), through inZone.
	it('writes many instants exactly as Intl does, across daylight-saving changes', () => {
		const zones = [
			'America/Denver', // -7/-6, changes at 2 AM local
			'Europe/London', // 0/+1, changes at 1 AM UTC
			'Australia/Lord_Howe', // +10:30/+11, a half-hour change
			'Asia/Kathmandu', // +5:45, no change
			'Pacific/Chatham', // +12:45/+13:45
			'America/St_Johns' // -3:30/-2:30
		];
		// Every 7 minutes through both of 2027's change days in each hemisphere, plus a spread of
		// instants from 1975 to 2040 and one before 1973 (which Intl answers itself).
		const instants: number[] = [];
		for (const start of [
			Date.UTC(2027, 2, 6),
			Date.UTC(2027, 3, 2),
			Date.UTC(2027, 9, 1),
			Date.UTC(2027, 9, 29)
		]) {
			for (let t = start; t < start + 4 * 86_400_000; t += 7 * 60_000) instants.push(t);
		}
		for (let t = Date.UTC(1975, 0, 1); t < Date.UTC(2040, 0, 1); t += 3_456_789_123) {
			instants.push(t);
		}
		instants.push(Date.UTC(1960, 5, 1, 23, 59, 59, 999));
		for (const zone of zones) {
			const write = whenWriter(zone);
			for (const t of instants) {
				expect(write(t), `${zone} ${new Date(t).toISOString()}`).toBe(inZone(t, zone, 'when'));
			}
		}
	});
	it('writes midnight and noon as 12, and the minutes with two digits', () => {
		const write = whenWriter('UTC');
		expect(write(Date.UTC(2027, 4, 14, 0, 5))).toBe(
			inZone(Date.UTC(2027, 4, 14, 0, 5), 'UTC', 'when')
		);
		expect(write(Date.UTC(2027, 4, 14, 0, 5)).replace(/\s/g, ' ')).toBe('May 14, 12:05 AM');
		expect(write(Date.UTC(2027, 4, 14, 12, 0)).replace(/\s/g, ' ')).toBe('May 14, 12:00 PM');
	});
});
