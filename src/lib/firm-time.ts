// Dates and times as people read them: an instant in a named time zone (the firm's, from
// Settings, or a visit's own), or a calendar day ("2027-05-14") that no time zone may shift. One
// formatter per style and zone, made once: building an Intl.DateTimeFormat costs far more than
// using it. Pure: pages, mails and the server share it. Arithmetic on wall-clock time (offsets,
// midnight in a zone, adding days) lives in $lib/scheduling/zone.

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
