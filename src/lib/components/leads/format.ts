// Times and waits as the office reads them, always in the firm's time zone ($lib/firm-time keeps
// one formatter per style and zone: a new one per row of a long list or export took the app's
// memory from about 130 MB to 2 GB).
import { inZone } from '$lib/firm-time';

export function formatWhen(value: string | Date, timeZone: string): string {
	return inZone(value, timeZone, 'when');
}

export function formatDay(value: string | Date, timeZone: string): string {
	return inZone(value, timeZone, 'day');
}

/** A duration in words: "45 min", "5 h 10 min", "3 d 4 h". */
export function formatDuration(ms: number): string {
	const minutes = Math.max(0, Math.round(ms / 60_000));
	if (minutes < 60) return `${minutes} min`;
	const hours = Math.floor(minutes / 60);
	if (hours < 48) return minutes % 60 ? `${hours} h ${minutes % 60} min` : `${hours} h`;
	const days = Math.floor(hours / 24);
	return hours % 24 ? `${days} d ${hours % 24} h` : `${days} d`;
}

export interface Wait {
	/** How long the lead waited (or has waited so far) for the first reply. */
	ms: number;
	awaiting: boolean;
	late: boolean;
	text: string;
}

export function waitOf(
	lead: { createdAt: string | Date; firstReplyAt: string | Date | null; stage: string },
	targetHours: number,
	now: number = Date.now()
): Wait {
	const created = new Date(lead.createdAt).getTime();
	const replied = lead.firstReplyAt ? new Date(lead.firstReplyAt).getTime() : null;
	const open = replied === null && lead.stage !== 'closed' && lead.stage !== 'sold';
	const ms = (replied ?? (open ? now : created)) - created;
	const late = ms > targetHours * 3_600_000;
	const text =
		replied !== null
			? `replied in ${formatDuration(ms)}`
			: open
				? `waiting ${formatDuration(ms)}`
				: 'no reply logged';
	return { ms, awaiting: open, late: late && (open || replied !== null), text };
}
