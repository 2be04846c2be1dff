// The e-mails payments send: the homeowner's receipt (or refund note), the pay link, and a
// notice to the office when a provider event needs a person (amount mismatch, unknown checkout,
// a payment larger than what was owed).
import { escapeHtml, htmlBody } from '../platform/mail';
import { eq } from 'drizzle-orm';
import { db } from '../platform/db';
import { settings } from '../platform/db/schema';
import { origin } from '../platform/env';
import { jobRef } from '../jobs/labels';
import type { Job, PaymentMethod, Settings } from '../platform/db/schema';
import { formatCents } from '$lib/money';

type Db = Pick<typeof db, 'select'>;

/** The firm's settings read on the caller's connection (inside its transaction, no second one). */
export async function firmOn(tx: Db): Promise<Settings> {
	const [row] = await tx.select().from(settings).where(eq(settings.id, 1));
	if (!row) throw new Error('The firm settings are missing: run `npm run seed`.');
	return row;
}

const METHOD: Record<PaymentMethod, string> = {
	card: 'card',
	cheque: 'cheque',
	cash: 'cash',
	bank_transfer: 'bank transfer'
};

export async function receiptMail(
	tx: Db,
	r: {
		job: Job;
		to: string;
		name: string;
		amountCents: number;
		method: PaymentMethod;
		reference: string | null;
		balanceCents: number;
		reason: string | null;
	}
) {
	const firm = await firmOn(tx);
	const refund = r.amountCents < 0;
	const lines = refund
		? [
				`Hello ${r.name},`,
				`We have refunded ${formatCents(-r.amountCents)} by ${METHOD[r.method]} on job ${jobRef(r.job.number)} (${r.job.title}).`,
				`Reason: ${r.reason ?? ''}`,
				`Balance now: ${formatCents(r.balanceCents)}.`
			]
		: [
				`Hello ${r.name},`,
				`Thank you: we received ${formatCents(r.amountCents)} by ${METHOD[r.method]}${r.reference ? ` (reference ${r.reference})` : ''} for job ${jobRef(r.job.number)} (${r.job.title}).`,
				r.balanceCents > 0
					? `Balance still to pay: ${formatCents(r.balanceCents)}.`
					: r.balanceCents < 0
						? `You have paid ${formatCents(-r.balanceCents)} more than the job's total; we will refund it.`
						: 'The job is paid in full.'
			];
	const footer = `${firm.firmName} · ${firm.phone} · ${firm.email}`;
	return {
		to: r.to,
		subject: refund
			? `Refund of ${formatCents(-r.amountCents)} · ${firm.firmName}`
			: `Receipt: ${formatCents(r.amountCents)} received · ${firm.firmName}`,
		text: [...lines, '', footer].join('\n'),
		html: htmlBody(lines, undefined, footer)
	};
}

export async function payLinkMail(
	tx: Db,
	r: {
		job: Job;
		to: string;
		name: string;
		token: string;
		dueCents: number;
	}
) {
	const firm = await firmOn(tx);
	const url = `${origin()}/pay/${r.token}`;
	const lines = [
		`Hello ${r.name},`,
		`Your payment page for job ${jobRef(r.job.number)} (${r.job.title}) shows what is due (${formatCents(r.dueCents)}), your invoices and the payments received.`
	];
	return {
		to: r.to,
		subject: `Payment for job ${jobRef(r.job.number)} · ${firm.firmName}`,
		text: [...lines, '', url, '', `${firm.firmName} · ${firm.phone}`].join('\n'),
		html: htmlBody(
			lines,
			{ label: 'Open your payment page', url },
			`${firm.firmName} · ${firm.phone}`
		)
	};
}

export async function officeAlertMail(tx: Db, subject: string, lines: string[]) {
	const firm = await firmOn(tx);
	return {
		to: firm.email,
		subject: `Payments: ${subject}`,
		text: lines.join('\n'),
		html: `<!doctype html><html><body>${lines.map((l) => `<p>${escapeHtml(l)}</p>`).join('')}</body></html>`
	};
}
