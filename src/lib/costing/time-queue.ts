// The crew lead's time entries kept on the phone until the server has them. Every entry gets its
// idempotency key when it is typed; the queue sends what is waiting, and an entry leaves the
// waiting list only when the server answers that it stored it (or had it already). A send cut
// off half way leaves the entry waiting, and the next send carries the same key, so the server
// stores it once. Pure apart from the storage passed in (localStorage in the browser).

export interface QueuedEntry {
	clientKey: string;
	jobId: string;
	/** An existing task of the job, or a new task's name typed on site. */
	taskId: string | null;
	newTask: string | null;
	/** What the crew lead saw as the task's name, for the list on the phone. */
	taskLabel: string;
	person: string;
	workDate: string;
	minutes: number;
	startedAt: string | null;
	endedAt: string | null;
	note: string;
	state: 'waiting' | 'sent' | 'refused';
	/** Why the server refused it (shown beside the entry; the entry is kept). */
	problem?: string;
}

export interface KeyValueStore {
	getItem(key: string): string | null;
	setItem(key: string, value: string): void;
}

export interface SendResult {
	stored: { clientKey: string }[];
	refused: { clientKey: string; message: string }[];
}

export type Sender = (entries: QueuedEntry[]) => Promise<SendResult>;

const STORE_KEY = 'rillstone.time-entries.v1';
/** Sent entries stay listed (as sent) for this many per job, so the crew lead sees the day. */
const KEEP_SENT = 200;

export class TimeQueue {
	constructor(private readonly store: KeyValueStore) {}

	all(): QueuedEntry[] {
		try {
			const raw = this.store.getItem(STORE_KEY);
			const parsed: unknown = raw ? JSON.parse(raw) : [];
			return Array.isArray(parsed) ? (parsed as QueuedEntry[]) : [];
		} catch {
			return [];
		}
	}

	forJob(jobId: string): QueuedEntry[] {
		return this.all().filter((e) => e.jobId === jobId);
	}

	private save(entries: QueuedEntry[]) {
		const sent = entries.filter((e) => e.state === 'sent');
		const drop = new Set(sent.slice(0, Math.max(0, sent.length - KEEP_SENT)));
		this.store.setItem(STORE_KEY, JSON.stringify(entries.filter((e) => !drop.has(e))));
	}

	/** Keeps a typed entry on the device before anything is sent. */
	add(entry: Omit<QueuedEntry, 'state'>): QueuedEntry {
		const queued: QueuedEntry = { ...entry, state: 'waiting' };
		this.save([...this.all(), queued]);
		return queued;
	}

	/** Removes an entry that has not reached the server (a sent one stays: it is on record). */
	discard(clientKey: string): void {
		this.save(this.all().filter((e) => e.clientKey !== clientKey || e.state === 'sent'));
	}

	/**
	 * Sends the job's waiting entries. Returns how many the server now holds; a failed send
	 * (offline, a timeout, a 5xx) throws and leaves every entry waiting for the next try.
	 */
	async flush(jobId: string, send: Sender): Promise<number> {
		const waiting = this.forJob(jobId).filter((e) => e.state === 'waiting');
		if (!waiting.length) return 0;
		const result = await send(waiting);
		const stored = new Set(result.stored.map((s) => s.clientKey));
		const refused = new Map(result.refused.map((r) => [r.clientKey, r.message]));
		// Read again: an entry typed while the send was under way must not be lost.
		this.save(
			this.all().map((e) => {
				if (stored.has(e.clientKey)) return { ...e, state: 'sent', problem: undefined };
				const message = refused.get(e.clientKey);
				return message === undefined ? e : { ...e, state: 'refused', problem: message };
			})
		);
		return stored.size;
	}
}

/** A fresh idempotency key for an entry (random, 128 bits). */
export function newClientKey(): string {
	// randomUUID exists only in secure contexts (https or localhost); getRandomValues everywhere.
	const c = globalThis.crypto as Crypto & { randomUUID?: () => string };
	if (typeof c.randomUUID === 'function') return c.randomUUID();
	const bytes = new Uint8Array(16);
	c.getRandomValues(bytes);
	return [...bytes].map((b) => b.toString(16).padStart(2, '0')).join('');
}
