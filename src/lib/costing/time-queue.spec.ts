import { describe, expect, it } from 'vitest';
import { newClientKey, TimeQueue, type QueuedEntry, type SendResult } from './time-queue';

class Memory {
	data = new Map<string, string>();
	getItem(k: string) {
		return this.data.get(k) ?? null;
	}
	setItem(k: string, v: string) {
		this.data.set(k, v);
	}
}

const typed = (jobId: string, minutes: number) => ({
	clientKey: newClientKey(),
	jobId,
	taskId: 't1',
	newTask: null,
	taskLabel: 'Dig and set basin',
	person: 'Rosa',
	workDate: '2027-05-14',
	minutes,
	startedAt: null,
	endedAt: null,
	note: ''
});

/** A server that stores by key, as the real one does. */
function server() {
	const stored = new Map<string, QueuedEntry>();
	return {
		stored,
		send: async (entries: QueuedEntry[]): Promise<SendResult> => {
			for (const e of entries) if (!stored.has(e.clientKey)) stored.set(e.clientKey, e);
			return { stored: entries.map((e) => ({ clientKey: e.clientKey })), refused: [] };
		}
	};
}

describe('the time queue on the phone', () => {
	it('keeps entries through a failed send and sends each once the connection is back', async () => {
		const store = new Memory();
		const queue = new TimeQueue(store);
		queue.add(typed('job-1', 240));
		queue.add(typed('job-1', 210));
		queue.add(typed('job-2', 60));
		await expect(
			queue.flush('job-1', () => Promise.reject(new TypeError('Failed to fetch')))
		).rejects.toThrow('Failed to fetch');
		expect(new TimeQueue(store).forJob('job-1').map((e) => e.state)).toEqual([
			'waiting',
			'waiting'
		]);
		const s = server();
		expect(await queue.flush('job-1', s.send)).toBe(2);
		expect(queue.forJob('job-1').map((e) => e.state)).toEqual(['sent', 'sent']);
		// Nothing waiting: a further flush sends nothing; the other job's entry still waits.
		expect(await queue.flush('job-1', s.send)).toBe(0);
		expect(queue.forJob('job-2')[0].state).toBe('waiting');
		expect(s.stored.size).toBe(2);
	});

	it('resends with the same key when the answer was lost, and keeps an entry typed meanwhile', async () => {
		const store = new Memory();
		const queue = new TimeQueue(store);
		const first = queue.add(typed('job-1', 90));
		const s = server();
		// The server stores the entry, then the connection drops before the answer arrives;
		// meanwhile the crew lead types another entry.
		await expect(
			queue.flush('job-1', async (entries) => {
				await s.send(entries);
				queue.add(typed('job-1', 30));
				throw new TypeError('network connection was lost');
			})
		).rejects.toThrow();
		const keys: string[] = [];
		await queue.flush('job-1', async (entries) => {
			keys.push(...entries.map((e) => e.clientKey));
			return s.send(entries);
		});
		expect(keys[0]).toBe(first.clientKey);
		expect(keys).toHaveLength(2);
		expect(s.stored.size).toBe(2);
		expect(queue.forJob('job-1').every((e) => e.state === 'sent')).toBe(true);
	});

	it('keeps a refused entry with the reason until the crew lead removes it', async () => {
		const queue = new TimeQueue(new Memory());
		const e = queue.add(typed('job-1', 30));
		await queue.flush('job-1', async () => ({
			stored: [],
			refused: [{ clientKey: e.clientKey, message: 'That task is not on this job.' }]
		}));
		expect(queue.forJob('job-1')[0]).toMatchObject({
			state: 'refused',
			problem: 'That task is not on this job.'
		});
		queue.discard(e.clientKey);
		expect(queue.forJob('job-1')).toEqual([]);
		expect(newClientKey()).toMatch(/^[A-Za-z0-9-]{16,64}$/);
	});
});
