// Steps of the estimate builder the specs share: waiting for an autosave, and sending the
// estimate to open the link the homeowner is mailed.
import { expect, type Page } from '@playwright/test';
import type { Sql } from 'postgres';
import { linkIn, waitForMail } from '../../support/mailbox';

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
