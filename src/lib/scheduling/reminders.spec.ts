import { describe, expect, it } from 'vitest';
import { relativeDay, reminderPlan } from './reminders';
import { zonedInstant } from './zone';

const TZ = 'America/Denver';
const at = (date: string, hh: number, mm = 0) => zonedInstant(date, hh * 60 + mm, TZ);

// The 24 h, 3 h, 2 h and 5 h lead times are reminders.ts's own (common practice, no source).
describe('reminderPlan (lead times: common practice, no source)', () => {
	it('sends a day before when the visit is more than 26 hours away (24 h lead: common practice, no source)', () => {
		const start = at('2027-03-18', 10);
		expect(reminderPlan(start, at('2027-03-15', 8))).toEqual({
			at: at('2027-03-17', 10),
			leadMinutes: 1440
		});
	});

	it('sends three hours before when a day-before reminder would come within two hours of the booking (3 h and 2 h: common practice, no source)', () => {
		// Booked at 08:00 for 09:00 tomorrow: the day-before time (09:00 today) is one hour away.
		expect(reminderPlan(at('2027-03-16', 9), at('2027-03-15', 8))).toEqual({
			at: at('2027-03-16', 6),
			leadMinutes: 180
		});
		// Booked at 08:00 for 15:00 the same day.
		expect(reminderPlan(at('2027-03-15', 15), at('2027-03-15', 8))?.at).toEqual(
			at('2027-03-15', 12)
		);
	});

	it('sends none when the visit is under five hours away: the invitation stands in (5 h: common practice, no source)', () => {
		expect(reminderPlan(at('2027-03-15', 12, 59), at('2027-03-15', 8))).toBeNull();
		expect(reminderPlan(at('2027-03-15', 10), at('2027-03-15', 8))).toBeNull();
		expect(reminderPlan(at('2027-03-15', 13), at('2027-03-15', 8))?.leadMinutes).toBe(180);
	});

	it('counts real hours across the spring-forward night (2027-03-14 in America/Denver)', () => {
		// 10:00 MDT on the 14th is 16:00 UTC; 24 hours earlier is 09:00 MST on the 13th (16:00 UTC).
		const plan = reminderPlan(at('2027-03-14', 10), at('2027-03-10', 8))!;
		expect(plan.at.toISOString()).toBe('2027-03-13T16:00:00.000Z');
	});
});

describe('relativeDay', () => {
	it('names today and tomorrow in the firm zone, not in UTC', () => {
		// 20:00 in Denver is already the next day in UTC.
		const evening = at('2027-03-15', 20);
		expect(relativeDay(at('2027-03-15', 21), evening, TZ)).toBe('today');
		expect(relativeDay(at('2027-03-16', 9), evening, TZ)).toBe('tomorrow');
		expect(relativeDay(at('2027-03-17', 9), evening, TZ)).toBeNull();
	});
});
