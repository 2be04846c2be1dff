// Two inquiries with one phone number and two e-mails are two contacts: each lead page says
// "Same person?" about the other, and the merge keeps both people's details on record.
import { randomBytes } from 'node:crypto';
import postgres from 'postgres';
import { expect, test } from '@playwright/test';
import { signIn } from './pages/staff';

const sql = postgres(process.env.E2E_DATABASE_URL ?? process.env.DATABASE_URL!, {
	max: 1,
	onnotice: () => {}
});
test.afterAll(async () => {
	await sql.end();
});

async function lead(name: string, email: string, phone: string) {
	const contactId = randomBytes(9).toString('base64url');
	const leadId = randomBytes(9).toString('base64url');
	const digits = phone.replace(/\D/g, '');
	await sql`insert into contacts (id, name, email, phone, phone_digits)
		values (${contactId}, ${name}, ${email}, ${phone}, ${digits})`;
	const [row] = await sql<{ number: number }[]>`insert into leads (id, contact_id, services)
		values (${leadId}, ${contactId}, ${['water-feature']}) returning number`;
	await sql`insert into activities (lead_id, kind, body) values (${leadId}, 'inquiry', '')`;
	return { leadId, number: row.number };
}

test('both leads show the possible duplicate, and the merge keeps both on record', async ({
	page
}) => {
	const tag = randomBytes(3).toString('hex');
	const n = String(Math.floor(Math.random() * 1e6)).padStart(6, '0');
	const phone = `(555) 3${n.slice(0, 2)}-${n.slice(2)}`;
	const first = await lead(`Wren Alder ${tag}`, `wren.${tag}@test.example`, phone);
	const second = await lead(`Ivo Sallow ${tag}`, `ivo.${tag}@test.example`, phone);
	await signIn(page, 'sales');

	await page.goto(`/office/leads/${second.leadId}`);
	const card = page.getByRole('region', { name: 'Same person?' });
	await expect(card).toContainText(`Possible duplicate of R-${first.number}`);
	await expect(card).toContainText(`Wren Alder ${tag}`);
	await expect(card).toContainText('same phone number');

	await page.goto(`/office/leads/${first.leadId}`);
	await expect(page.getByRole('region', { name: 'Same person?' })).toContainText(
		`Possible duplicate of R-${second.number}`
	);
	await page.getByRole('button', { name: 'Merge: same person' }).click();
	await expect(page.getByText('Merged: both leads now show the same person')).toBeVisible();
	const record = page.getByRole('region', { name: 'Also on record for this person' });
	await expect(record).toContainText(`ivo.${tag}@test.example`);
	await expect(page.locator('[data-kind="contact.merged"]')).toContainText('same person');

	// The other lead still carries its own contact: its mail goes to the address it gave.
	await page.goto(`/office/leads/${second.leadId}`);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(`Ivo Sallow ${tag}`);
	await expect(page.getByRole('region', { name: 'Also on record for this person' })).toContainText(
		`wren.${tag}@test.example`
	);
});
