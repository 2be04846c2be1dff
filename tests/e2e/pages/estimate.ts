// Steps of the estimate builder the specs share: a lead of the demo salesperson's to start from,
// waiting for an autosave, sending the estimate to open the link the homeowner is mailed, and
// accepting it on the homeowner's page.
import { expect, type Page } from '@playwright/test';
import type { Sql } from 'postgres';
import { seedLead } from '../../support/lead';
import { linkIn, waitForMail } from '../../support/mailbox';
import { demoUser } from './staff';

/** A lead assigned to the demo salesperson, visit booked, no estimate yet. */
export async function salesLead(sql: Sql, name: string, services: string[], message: string) {
	const [sales] = await sql`select id from users where email = ${demoUser('sales').email}`;
	return seedLead(sql, { name, services, message, assigneeId: sales.id });
}

/** The builder's next autosave (a PUT of the estimate that succeeded). */
export const saved = (page: Page) =>
	page.waitForResponse(
		(r) => r.url().includes('/api/estimates/') && r.request().method() === 'PUT' && r.ok()
	);

/** Sends the saved estimate; the homeowner's link from the mail and the stored totals. */
export async function sendAndOpen(sql: Sql, page: Page, lead: { id: string; email: string }) {
	await expect(page.getByTestId('save-status')).toHaveText(/All changes saved/);
	await page.getByRole('button', { name: /^Send to/ }).click();
	await expect(page.getByTestId('estimate-status')).toHaveText('Sent');
	const mail = await waitForMail(lead.email, /Your estimate from/);
	const [row] =
		await sql`select id, total_cents, deposit_cents from estimates where lead_id = ${lead.id}`;
	return { link: linkIn(mail, /^\/estimate\/[A-Za-z0-9_-]+$/), row };
}

/** Accepts on the homeowner's page; the total the acceptance recorded. The lead is then sold. */
export async function accept(
	sql: Sql,
	home: Page,
	lead: { id: string; name: string },
	estimateId: string
): Promise<number> {
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
