// Payments: what was asked of the provider (checkout requests), the payments received (online,
// by hand, refunds as negative amounts), webhook events handled exactly once, the homeowner's
// pay links, and invoices numbered from a counter row (no gaps, unlike a sequence).
import { sql } from 'drizzle-orm';
import {
	check,
	date,
	index,
	integer,
	jsonb,
	pgEnum,
	pgTable,
	text,
	timestamp,
	uniqueIndex
} from 'drizzle-orm/pg-core';
import { createdAt, updatedAt } from './columns';
import { users } from './auth';
import { jobs } from './jobs';

export const paymentKindEnum = pgEnum('payment_kind', ['deposit', 'progress', 'final', 'refund']);
export type PaymentKind = (typeof paymentKindEnum.enumValues)[number];
export const paymentMethodEnum = pgEnum('payment_method', [
	'card',
	'cheque',
	'cash',
	'bank_transfer'
]);
export type PaymentMethod = (typeof paymentMethodEnum.enumValues)[number];
export const checkoutStatusEnum = pgEnum('checkout_status', ['open', 'paid', 'expired']);
export const invoiceKindEnum = pgEnum('invoice_kind', ['deposit', 'final']);
export type InvoiceKind = (typeof invoiceKindEnum.enumValues)[number];

/** A hosted checkout the app asked the provider for: the amount and currency it must come back with. */
export const checkoutRequests = pgTable(
	'checkout_requests',
	{
		id: text('id').primaryKey(),
		jobId: text('job_id')
			.notNull()
			.references(() => jobs.id, { onDelete: 'cascade' }),
		kind: paymentKindEnum('kind').notNull(),
		amountCents: integer('amount_cents').notNull(),
		currency: text('currency').notNull(),
		providerSessionId: text('provider_session_id').notNull().unique(),
		url: text('url').notNull(),
		status: checkoutStatusEnum('status').notNull().default('open'),
		/** Why a completed checkout was not recorded as a payment (amount or currency mismatch). */
		problem: text('problem'),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [index('checkout_requests_job_idx').on(t.jobId, t.status)]
);

export const payments = pgTable(
	'payments',
	{
		id: text('id').primaryKey(),
		jobId: text('job_id')
			.notNull()
			.references(() => jobs.id, { onDelete: 'cascade' }),
		kind: paymentKindEnum('kind').notNull(),
		method: paymentMethodEnum('method').notNull(),
		/** Signed: refunds are negative. */
		amountCents: integer('amount_cents').notNull(),
		currency: text('currency').notNull().default('usd'),
		/** The provider's checkout session: one payment per checkout, however often it is reported. */
		providerCheckoutId: text('provider_checkout_id').unique(),
		/** Cheque number, transfer reference, provider payment id… */
		reference: text('reference'),
		receivedOn: date('received_on').notNull(),
		reason: text('reason'),
		note: text('note').notNull().default(''),
		recordedBy: text('recorded_by').references(() => users.id),
		createdAt: createdAt()
	},
	(t) => [
		index('payments_job_idx').on(t.jobId, t.receivedOn),
		uniqueIndex('payments_reference_idx').on(t.jobId, t.method, t.reference),
		check(
			'payments_refund_sign',
			sql`(${t.kind} = 'refund' and ${t.amountCents} < 0 and ${t.reason} is not null) or (${t.kind} <> 'refund' and ${t.amountCents} > 0)`
		)
	]
);

/** Webhook events already handled (the unique id makes a replay a no-op). */
export const paymentEvents = pgTable('payment_events', {
	eventId: text('event_id').primaryKey(),
	type: text('type').notNull(),
	providerSessionId: text('provider_session_id'),
	/** recorded, duplicate_checkout, unknown_checkout, amount_mismatch, expired, ignored */
	outcome: text('outcome').notNull(),
	receivedAt: timestamp('received_at', { withTimezone: true }).notNull().defaultNow()
});

/** The homeowner's private link to pay and read invoices (only the SHA-256 of the token is kept). */
export const payLinks = pgTable(
	'pay_links',
	{
		id: text('id').primaryKey(),
		jobId: text('job_id')
			.notNull()
			.references(() => jobs.id, { onDelete: 'cascade' }),
		tokenHash: text('token_hash').notNull().unique(),
		createdAt: createdAt()
	},
	(t) => [index('pay_links_job_idx').on(t.jobId)]
);

/** One row: the last invoice number issued, bumped in the transaction that inserts the invoice. */
export const invoiceCounter = pgTable('invoice_counter', {
	id: integer('id').primaryKey().default(1),
	last: integer('last').notNull().default(0)
});

export interface InvoiceLine {
	description: string;
	amountCents: number;
}

export interface InvoiceSnapshot {
	firm: { name: string; email: string; phone: string; address: string };
	billTo: { name: string; email: string | null; address: string };
	jobNumber: number;
	title: string;
	lines: InvoiceLine[];
	payments: { receivedOn: string; method: string; reference: string | null; amountCents: number }[];
}

export const invoices = pgTable(
	'invoices',
	{
		id: text('id').primaryKey(),
		number: integer('number').notNull().unique(),
		jobId: text('job_id')
			.notNull()
			.references(() => jobs.id, { onDelete: 'cascade' }),
		kind: invoiceKindEnum('kind').notNull(),
		snapshot: jsonb('snapshot').$type<InvoiceSnapshot>().notNull(),
		totalCents: integer('total_cents').notNull(),
		taxCents: integer('tax_cents').notNull(),
		paymentsCents: integer('payments_cents').notNull(),
		balanceDueCents: integer('balance_due_cents').notNull(),
		issuedAt: timestamp('issued_at', { withTimezone: true }).notNull().defaultNow(),
		dueOn: date('due_on').notNull(),
		createdAt: createdAt()
	},
	(t) => [uniqueIndex('invoices_job_kind_idx').on(t.jobId, t.kind)]
);

export type Payment = typeof payments.$inferSelect;
export type CheckoutRequestRow = typeof checkoutRequests.$inferSelect;
export type Invoice = typeof invoices.$inferSelect;
