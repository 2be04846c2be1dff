// Dates and times as people read them: an instant in a named time zone (the firm's, from
// Settings, or a visit's own), or a calendar day ("2027-05-14") that no time zone may shift. One
// formatter per style and zone, made once: building an Intl.DateTimeFormat costs far more than
// using it. Pure: pages, mails and the server share it. Arithmetic on wall-clock time (offsets,
// midnight in a zone, adding days) lives in $lib/scheduling/zone.

import { offsetMinutes } from './scheduling/zone';

const STYLES = {
	/** "May 14, 2027" */
	date: { dateStyle: 'long' },
	/** "May 14, 2027 at 9:30 AM" */
	dateTime: { dateStyle: 'long', timeStyle: 'short' },
	/** "Friday, May 14, 2027" */
	dayLong: { weekday: 'long', month: 'long', day: 'numeric', year: 'numeric' },
	/** "Fri, May 14, 2027" */
	dayMedium: { weekday: 'short', month: 'short', day: 'numeric', year: 'numeric' },
	/** "Friday, May 14" */
	dayMonth: { weekday: 'long', month: 'long', day: 'numeric' },
	/** "Fri, May 14" */
	dayShort: { weekday: 'short', day: 'numeric', month: 'short' },
	/** "9:30 AM MDT" */
	time: { hour: 'numeric', minute: '2-digit', timeZoneName: 'short' },
	/** "May 14, 9:30 AM" (the office's lists) */
	when: { month: 'short', day: 'numeric', hour: 'numeric', minute: '2-digit' },
	/** "May 14, 2027" (the office's lists) */
	day: { month: 'short', day: 'numeric', year: 'numeric' },
	/** "Friday, May 14, 9:30 AM MDT" */
	whenLong: {
		weekday: 'long',
		month: 'long',
		day: 'numeric',
		hour: 'numeric',
		minute: '2-digit',
		timeZoneName: 'short'
	},
	/** "Fri, May 14, 9:30 AM" */
	whenMedium: {
		weekday: 'short',
		month: 'short',
		day: 'numeric',
		hour: 'numeric',
		minute: '2-digit'
	},
	/** "Fri, May 14, 2027, 9:30 AM" */
	whenYear: {
		weekday: 'short',
		month: 'short',
		day: 'numeric',
		year: 'numeric',
		hour: 'numeric',
		minute: '2-digit'
	},
	/** "May 14, 2027, 9:30 AM" */
	dateTimeMedium: { dateStyle: 'medium', timeStyle: 'short' },
	/** "May 14, 2027" */
	dateMedium: { dateStyle: 'medium' },
	/** "Friday, May 14, 2027" */
	dateFull: { dateStyle: 'full' },
	/** "9:30 AM" */
	clock: { hour: 'numeric', minute: '2-digit' },
	/** "5/14/2027" (tables and short notes) */
	numericDay: { month: 'numeric', day: 'numeric', year: 'numeric' },
	/** "5/14/2027, 9:30 AM" */
	numericWhen: {
		month: 'numeric',
		day: 'numeric',
		year: 'numeric',
		hour: 'numeric',
		minute: '2-digit'
	},
	/** "Fri, May 14, 9:30 AM MDT" */
	whenShort: {
		weekday: 'short',
		month: 'short',
		day: 'numeric',
		hour: 'numeric',
		minute: '2-digit',
		timeZoneName: 'short'
	}
} satisfies Record<string, Intl.DateTimeFormatOptions>;

export type DateStyle = keyof typeof STYLES;

const formatters = new Map<string, Intl.DateTimeFormat>();

function formatter(style: DateStyle, timeZone: string): Intl.DateTimeFormat {
	const key = `${style} ${timeZone}`;
	let f = formatters.get(key);
	if (!f) {
		f = new Intl.DateTimeFormat('en-US', { ...STYLES[style], timeZone });
		formatters.set(key, f);
	}
	return f;
}

/** An instant as it reads in `timeZone` (the firm's, or the visit's own). */
export function inZone(value: Date | string | number, timeZone: string, style: DateStyle): string {
	return formatter(style, timeZone).format(new Date(value));
}

/**
 * A calendar day ("2027-05-14") in words, read as the date it names: noon UTC, in UTC, so no
 * viewer's or firm's zone can move it to the day before or after.
 */
export function calendarDay(day: string, style: DateStyle = 'dayShort'): string {
	return formatter(style, 'UTC').format(new Date(`${day}T12:00:00Z`));
}

const DAY_MS = 86_400_000;
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
/** From 1973 on every zone's offset is a whole number of minutes (Liberia's -0:44:30 ended 1972). */
const WHOLE_MINUTE_OFFSETS_FROM = Date.UTC(1973, 0, 1);

/**
 * The `when` style ("May 14, 9:30 AM") for many instants in one zone, as `inZone` writes it but
 * about twenty times faster: the zone's offset is asked of Intl once per UTC day, and the text is
 * made from the day's text and the minute's, each made once. A day whose offset differs at its
 * first and last millisecond holds a change of offset (daylight saving), and its instants go
 * through Intl itself. For exports of many rows; a page of 25 has no need for it.
 */
export function whenWriter(timeZone: string): (ms: number) => string {
	const offsets = new Map<number, number | null>();
	const offsetOfDay = (day: number): number | null => {
		let offset = offsets.get(day);
		if (offset === undefined) {
			const first = offsetMinutes(new Date(day * DAY_MS), timeZone);
			const last = offsetMinutes(new Date(day * DAY_MS + DAY_MS - 1), timeZone);
			offset = first === last ? first * 60_000 : null;
			offsets.set(day, offset);
		}
		return offset;
	};
	// The space before AM/PM as this platform's Intl writes it (a narrow no-break space in some ICU
	// versions), so both paths agree.
	const space = formatter('when', 'UTC')
		.format(Date.UTC(2000, 0, 1, 9, 5))
		.slice(-3, -2);
	const clock = Array.from({ length: 1440 }, (_, m) => {
		const hour = Math.floor(m / 60);
		const minute = m % 60;
		return `${hour % 12 || 12}:${minute < 10 ? '0' : ''}${minute}${space}${hour < 12 ? 'AM' : 'PM'}`;
	});
	const days = new Map<number, string>();
	const dayText = (day: number) => {
		let text = days.get(day);
		if (text === undefined) {
			const date = new Date(day * DAY_MS);
			text = `${MONTHS[date.getUTCMonth()]} ${date.getUTCDate()}, `;
			days.set(day, text);
		}
		return text;
	};
	return (ms) => {
		const offset = ms >= WHOLE_MINUTE_OFFSETS_FROM ? offsetOfDay(Math.floor(ms / DAY_MS)) : null;
		if (offset === null) return inZone(ms, timeZone, 'when');
		const wall = ms + offset;
		const day = Math.floor(wall / DAY_MS);
		return dayText(day) + clock[Math.floor((wall - day * DAY_MS) / 60_000)];
	};
}
