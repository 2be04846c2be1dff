import { error, fail } from '@sveltejs/kit';
import { handPaymentSchema, invoiceSchema, refundSchema } from '$lib/schema/payments';
import { requireRole } from '$lib/server/auth/access';
import { sendPayLink } from '$lib/server/payments/checkout';
import { ensureInvoice, invoicesOf } from '$lib/server/payments/invoices';
import {
	jobMoney,
	PaymentError,
	paymentsOf,
	recordHandPayment,
	recordRefund
} from '$lib/server/payments/ledger';
import { jobWithContact } from '$lib/server/payments/views';
import { firmToday } from '$lib/server/platform/settings';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/platform/forms';

async function jobOr404(id: string) {
	const row = await jobWithContact(id);
	if (!row) error(404, 'There is no such job.');
	return row;
}

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner');
	const { job, contactName, contactEmail } = await jobOr404(event.params.jobId);
	return {
		job: { id: job.id, number: job.number, title: job.title, stage: job.stage },
		contactName,
		contactEmail,
		money: await jobMoney(job),
		payments: await paymentsOf(job.id),
		invoices: await invoicesOf(job.id),
		today: await firmToday()
	};
};

const errs = (e: Record<string, string>) => e;

/** The form field a ledger refusal is about, so its message sits beside that field. */
const FIELD_OF: Partial<Record<PaymentError['code'], string>> = {
	duplicate_reference: 'reference',
	over_balance: 'amount',
	over_refund: 'amount'
};

const failPayment = (form: string, e: unknown, values: Record<string, string>) => {
	if (e instanceof PaymentError) {
		if (e.code === 'not_found') error(404, e.message);
		return fail(400, { form, values, errors: errs({ [FIELD_OF[e.code] ?? 'amount']: e.message }) });
	}
	throw e;
};

export const actions: Actions = {
	record: async (event) => {
		const user = requireRole(event, 'owner');
		const data = await event.request.formData();
		const parsed = await parseForm(data, handPaymentSchema, { extra: { form: 'record' } });
		if (!parsed.ok) return parsed.failure;
		const { values } = parsed;
		await jobOr404(event.params.jobId);
		try {
			await recordHandPayment(
				event.params.jobId,
				{ ...parsed.data, amountCents: parsed.data.amount },
				user
			);
		} catch (e) {
			return failPayment('record', e, values);
		}
		return { form: 'record', saved: 'Payment recorded.' };
	},
	refund: async (event) => {
		const user = requireRole(event, 'owner');
		const data = await event.request.formData();
		const parsed = await parseForm(data, refundSchema, { extra: { form: 'refund' } });
		if (!parsed.ok) return parsed.failure;
		const { values } = parsed;
		await jobOr404(event.params.jobId);
		try {
			await recordRefund(
				event.params.jobId,
				{ ...parsed.data, amountCents: parsed.data.amount },
				user
			);
		} catch (e) {
			return failPayment('refund', e, values);
		}
		return { form: 'refund', saved: 'Refund recorded.' };
	},
	invoice: async (event) => {
		requireRole(event, 'owner');
		const parsed = await parseForm(event.request, invoiceSchema, { extra: { form: 'invoice' } });
		if (!parsed.ok) return parsed.failure;
		await jobOr404(event.params.jobId);
		const invoice = await ensureInvoice(event.params.jobId, parsed.data.kind);
		return { form: 'invoice', saved: `Invoice ${invoice.number} issued.` };
	},
	link: async (event) => {
		requireRole(event, 'owner');
		await jobOr404(event.params.jobId);
		try {
			await sendPayLink(event.params.jobId);
		} catch (e) {
			if (e instanceof PaymentError) {
				return fail(400, { form: 'link', values: {}, errors: errs({ link: e.message }) });
			}
			throw e;
		}
		return { form: 'link', saved: 'Payment link e-mailed to the homeowner.' };
	}
};
