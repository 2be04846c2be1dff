// The steps an estimate's end-to-end tests share: a lead written straight into the e2e database
// (assigned to the demo salesperson), waiting for the builder's autosave, sending the estimate and
// finding its link in the homeowner's mail, and accepting it on the homeowner's page.
import { expect, type Page } from '@playwright/test';
import { randomBytes } from 'node:crypto';
import type { Sql } from 'postgres';
import { linkIn, waitForMail } from '../../support/mailbox';
import { demoUser } from './staff';

export interface TestLead {
	id: string;
	email: string;
	/** The contact's name, made unique with a tag. */
	name: string;
}

/** The flow's steps bound to the e2e database. */
export function estimateFlow(sql: Sql) {
	async function makeLead(name: string, services: string[], message: string): Promise<TestLead> {
		const tag = randomBytes(4).toString('hex');
		const email = `${name.toLowerCase().split(' ')[0]}-${tag}@homeowner.example`;
		const [sales] = await sql`select id from users where email = ${demoUser('sales').email}`;
		await sql`insert into contacts (id, name, email) values (${'c-' + tag}, ${`${name} ${tag}`}, ${email})`;
		await sql`insert into leads (id, contact_id, stage, message, services, assignee_id)
			values (${'l-' + tag}, ${'c-' + tag}, 'visit_booked', ${message}, ${sql.array(services)}, ${sales.id})`;
		return { id: 'l-' + tag, email, name: `${name} ${tag}` };
	}

	/** Sends the saved estimate; its homeowner link (from the mail) and its row. */
	async function sendAndOpen(page: Page, lead: TestLead) {
		await expect(page.getByTestId('save-status')).toHaveText(/All changes saved/);
		await page.getByRole('button', { name: /^Send to/ }).click();
		await expect(page.getByTestId('estimate-status')).toHaveText('Sent');
		const mail = await waitForMail(lead.email, /Your estimate from/);
		const [row] =
			await sql`select id, total_cents, deposit_cents from estimates where lead_id = ${lead.id}`;
		return { link: linkIn(mail, /^\/estimate\/[A-Za-z0-9_-]+$/), row };
	}

	/** Accepts on the homeowner's page; the total the acceptance recorded. The lead is sold. */
	async function accept(home: Page, lead: TestLead, estimateId: string): Promise<number> {
		await home.getByLabel('Your full name').fill(lead.name);
		await home.getByRole('checkbox', { name: /I accept this estimate/ }).check();
		await home.getByRole('button', { name: /^Accept for/ }).click();
		await expect(home.getByRole('heading', { name: 'Accepted: thank you' })).toBeVisible();
		const [acc] =
			await sql`select total_cents from estimate_acceptances where estimate_id = ${estimateId}`;
		const [after] = await sql`select stage from leads where id = ${lead.id}`;
		expect(after.stage).toBe('sold');
		return acc.total_cents as number;
	}

	return { makeLead, sendAndOpen, accept };
}

/** The builder's next autosave that the server took. */
export const saved = (page: Page) =>
	page.waitForResponse(
		(r) => r.url().includes('/api/estimates/') && r.request().method() === 'PUT' && r.ok()
	);
