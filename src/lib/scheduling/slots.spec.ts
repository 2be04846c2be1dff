// The slot module checked against @date-fns/tz (a general-purpose time-zone library from the
// registry), around the 2027 daylight-saving changes in America/Denver: clocks go forward at
// 02:00 on Sunday 2027-03-14 and back at 02:00 on Sunday 2027-11-07.
import { TZDate } from '@date-fns/tz';
import { describe, expect, it } from 'vitest';
import { freeSlots, refusal, type SlotQuery, type WeeklyHours } from './slots';
import { offsetChanges, vtimezone } from './vtimezone';
import { formatClock, isDate, isTimeZone, wallTime, zonedInstant } from './zone';

const TZ = 'America/Denver';
const at = (y: number, mo: number, d: number, h: number, mi = 0) =>
	new Date(new TZDate(y, mo - 1, d, h, mi, TZ).getTime());

const allWeek = (start: string, end: string): WeeklyHours =>
	Object.fromEntries([0, 1, 2, 3, 4, 5, 6].map((d) => [String(d), [{ start, end }]]));

function query(over: Partial<SlotQuery>): SlotQuery {
	return {
		timeZone: TZ,
		from: '2027-03-14',
		to: '2027-03-14',
		now: new Date('2027-03-01T00:00:00Z'),
		weeklyHours: allWeek('08:00', '17:00'),
		visitMinutes: 60,
		bufferMinutes: 30,
		noticeMinutes: 120,
		daysAhead: 60,
		booked: [],
		timeOff: [],
		...over
	};
}

const labels = (q: SlotQuery) => freeSlots(q).map((s) => `${s.date} ${formatClock(s.minutes)}`);

describe('wall time in a zone, against @date-fns/tz', () => {
	it('agrees at every existing half hour of both change days and the days around them', () => {
		let checked = 0;
		for (const [y, m, d] of [
			[2027, 3, 13],
			[2027, 3, 14],
			[2027, 3, 15],
			[2027, 11, 6],
			[2027, 11, 7],
			[2027, 11, 8]
		]) {
			for (let minutes = 0; minutes < 24 * 60; minutes += 30) {
				const date = `${y}-${String(m).padStart(2, '0')}-${String(d).padStart(2, '0')}`;
				const skipped = date === '2027-03-14' && minutes >= 120 && minutes < 180;
				if (skipped) continue;
				const mine = zonedInstant(date, minutes, TZ);
				const theirs = at(y, m, d, Math.floor(minutes / 60), minutes % 60);
				expect(mine.toISOString(), `${date} ${formatClock(minutes)}`).toBe(theirs.toISOString());
				const back = new TZDate(mine.getTime(), TZ);
				expect(back.getHours() * 60 + back.getMinutes()).toBe(minutes);
				checked++;
			}
		}
		expect(checked).toBe(6 * 48 - 2);
	});

	it('reads a skipped time with the offset before the change and a repeated one as the earlier', () => {
		expect(zonedInstant('2027-03-14', 150, TZ).toISOString()).toBe('2027-03-14T09:30:00.000Z');
		expect(wallTime(zonedInstant('2027-03-14', 150, TZ), TZ).minutes).toBe(3 * 60 + 30);
		expect(zonedInstant('2027-11-07', 90, TZ).toISOString()).toBe('2027-11-07T07:30:00.000Z');
		expect(new TZDate(2027, 10, 7, 1, 30, TZ).getTime()).toBe(
			zonedInstant('2027-11-07', 90, TZ).getTime()
		);
	});

	it('tells valid zones and dates from invalid ones', () => {
		expect(isTimeZone('America/Denver')).toBe(true);
		expect(isTimeZone('Mars/Olympus_Mons')).toBe(false);
		expect(isTimeZone('')).toBe(false);
		expect(isDate('2027-02-29')).toBe(false);
		expect(isDate('2028-02-29')).toBe(true);
		expect(isDate('2027-3-1')).toBe(false);
	});
});

describe('free slots across daylight-saving changes', () => {
	it('opens at 08:00 local on both sides of the spring change (15:00 then 14:00 UTC)', () => {
		const slots = freeSlots(query({ from: '2027-03-13', to: '2027-03-15' }));
		const firsts = ['2027-03-13', '2027-03-14', '2027-03-15'].map((d) =>
			slots.find((s) => s.date === d)!.start.getTime()
		);
		expect(firsts).toEqual(
			[at(2027, 3, 13, 8), at(2027, 3, 14, 8), at(2027, 3, 15, 8)].map(Number)
		);
		expect(new Date(firsts[0]).toISOString()).toBe('2027-03-13T15:00:00.000Z');
		expect(new Date(firsts[1]).toISOString()).toBe('2027-03-14T14:00:00.000Z');
		// 08:00 … 16:00 every half hour, each day: 17 starts.
		expect(slots.filter((s) => s.date === '2027-03-14')).toHaveLength(17);
	});

	it('gives a night shift of 00:00–04:00 two real hours on 2027-03-14 and skips 02:00–03:00', () => {
		const q = query({ weeklyHours: { '0': [{ start: '00:00', end: '04:00' }] } });
		expect(labels(q)).toEqual([
			'2027-03-14 00:00',
			'2027-03-14 00:30',
			'2027-03-14 01:00',
			'2027-03-14 01:30',
			'2027-03-14 03:00'
		]);
		const slots = freeSlots(q);
		expect(slots.map((s) => s.start.getTime())).toEqual(
			[
				at(2027, 3, 14, 0),
				at(2027, 3, 14, 0, 30),
				at(2027, 3, 14, 1),
				at(2027, 3, 14, 1, 30),
				at(2027, 3, 14, 3)
			].map(Number)
		);
		// The 01:30 visit lasts a real hour and ends at 03:30 MDT.
		expect(slots[3].end.getTime()).toBe(at(2027, 3, 14, 3, 30).getTime());
	});

	it('gives the same shift five real hours on 2027-11-07, offering 01:00 and 01:30 twice', () => {
		const q = query({
			from: '2027-11-07',
			to: '2027-11-07',
			now: new Date('2027-11-01T00:00:00Z'),
			weeklyHours: { '0': [{ start: '00:00', end: '04:00' }] }
		});
		expect(labels(q).map((l) => l.slice(11))).toEqual([
			'00:00',
			'00:30',
			'01:00',
			'01:30',
			'01:00',
			'01:30',
			'02:00',
			'02:30',
			'03:00'
		]);
		const slots = freeSlots(q);
		expect(slots[0].start.toISOString()).toBe('2027-11-07T06:00:00.000Z');
		expect(slots.at(-1)!.end.getTime()).toBe(at(2027, 11, 7, 4).getTime());
		expect(slots.at(-1)!.end.toISOString()).toBe('2027-11-07T11:00:00.000Z');
	});
});

describe('free slots: the day, the notice, the buffers, the horizon', () => {
	it('offers no visit that would cross midnight unless the next day carries on', () => {
		const friday = { '5': [{ start: '20:00', end: '24:00' }] };
		const q = query({ from: '2027-03-12', to: '2027-03-12', weeklyHours: friday });
		expect(labels(q).at(-1)).toBe('2027-03-12 23:00');
		expect(refusal(zonedInstant('2027-03-12', 23 * 60 + 30, TZ), q)).toBe('outside_hours');

		const carriesOn = { ...friday, '6': [{ start: '00:00', end: '02:00' }] };
		const q2 = query({ from: '2027-03-12', to: '2027-03-13', weeklyHours: carriesOn });
		const list = labels(q2);
		expect(list).toContain('2027-03-12 23:30');
		expect(list).toContain('2027-03-13 01:00');
		expect(list).not.toContain('2027-03-13 01:30');
		const crossing = freeSlots(q2).find(
			(s) => s.date === '2027-03-12' && s.minutes === 23 * 60 + 30
		)!;
		expect(crossing.end.getTime()).toBe(at(2027, 3, 13, 0, 30).getTime());
		expect(refusal(crossing.start, q2)).toBeNull();
	});

	it('offers nothing on a day with no hours', () => {
		const weekdays = Object.fromEntries(
			[1, 2, 3, 4, 5].map((d) => [String(d), [{ start: '08:00', end: '17:00' }]])
		);
		const q = query({ from: '2027-03-13', to: '2027-03-15', weeklyHours: weekdays });
		const dates = new Set(freeSlots(q).map((s) => s.date));
		expect([...dates]).toEqual(['2027-03-15']);
		expect(refusal(at(2027, 3, 14, 10), q)).toBe('outside_hours');
	});

	it('splits a day around time off', () => {
		const q = query({
			from: '2027-03-15',
			to: '2027-03-15',
			timeOff: [{ start: at(2027, 3, 15, 11), end: at(2027, 3, 15, 13) }]
		});
		expect(labels(q).map((l) => l.slice(11))).toEqual([
			'08:00',
			'08:30',
			'09:00',
			'09:30',
			'10:00',
			'13:00',
			'13:30',
			'14:00',
			'14:30',
			'15:00',
			'15:30',
			'16:00'
		]);
		expect(refusal(at(2027, 3, 15, 10, 30), q)).toBe('time_off');
	});

	it('keeps the travel buffer after a booked visit and before the next', () => {
		// Booked 10:00–11:00 with its 30-minute buffer: blocked until 11:30.
		const q = query({
			from: '2027-03-15',
			to: '2027-03-15',
			booked: [{ start: at(2027, 3, 15, 10), end: at(2027, 3, 15, 11, 30) }]
		});
		const list = labels(q).map((l) => l.slice(11));
		expect(list.slice(0, 3)).toEqual(['08:00', '08:30', '11:30']);
		expect(refusal(at(2027, 3, 15, 9), q)).toBe('taken');
		expect(refusal(at(2027, 3, 15, 11), q)).toBe('taken');
		expect(refusal(at(2027, 3, 15, 11, 30), q)).toBeNull();
	});

	it('honours the shortest notice and refuses the past', () => {
		const now = at(2027, 3, 15, 9, 10);
		const q = query({ from: '2027-03-15', to: '2027-03-15', now });
		expect(labels(q)[0]).toBe('2027-03-15 11:30');
		expect(refusal(at(2027, 3, 15, 11), q)).toBe('too_soon');
		expect(refusal(at(2027, 3, 15, 9), q)).toBe('past');
	});

	it('offers nothing beyond the days ahead', () => {
		const q = query({
			from: '2027-03-15',
			to: '2027-03-25',
			now: at(2027, 3, 15, 7),
			daysAhead: 3
		});
		const dates = [...new Set(freeSlots(q).map((s) => s.date))];
		expect(dates).toEqual(['2027-03-15', '2027-03-16', '2027-03-17', '2027-03-18']);
		expect(refusal(at(2027, 3, 19, 9), q)).toBe('too_far');
	});
});

describe('VTIMEZONE', () => {
	it('carries the 2027 Denver changes at the instants @date-fns/tz knows', () => {
		const changes = offsetChanges(TZ, 2027, 2027);
		expect(changes.map((c) => [new Date(c.at).toISOString(), c.from, c.to])).toEqual([
			['2027-03-14T09:00:00.000Z', -420, -360],
			['2027-11-07T08:00:00.000Z', -360, -420]
		]);
		expect(new TZDate(changes[0].at, TZ).getHours()).toBe(3);
		expect(new TZDate(changes[1].at, TZ).getHours()).toBe(1);
		const text = vtimezone(TZ, 2027);
		expect(text).toContain('TZID:America/Denver');
		expect(text).toContain(
			'BEGIN:DAYLIGHT\r\nDTSTART:20270314T020000\r\nTZOFFSETFROM:-0700\r\nTZOFFSETTO:-0600'
		);
		expect(text).toContain(
			'BEGIN:STANDARD\r\nDTSTART:20271107T020000\r\nTZOFFSETFROM:-0600\r\nTZOFFSETTO:-0700'
		);
	});
});
