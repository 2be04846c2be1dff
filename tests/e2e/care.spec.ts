// Seasonal care end to end: a homeowner signs up for a plan on a phone and pays on the provider's
// (stand-in's) page; the owner plans the autumn into crew days and moves a visit; the crew lead
// completes it on a phone with the checklist and a photo; the homeowner gets the report by mail.
// The homeowners, their features and the plan are written straight to the e2e database; the
// season's first frost is set a few weeks from today so the autumn window is open now.
import { createHash, randomBytes } from 'node:crypto';
import postgres from 'postgres';
import { expect, test, type Page } from '@playwright/test';
import { yardJpeg } from '../fixtures/images/make';
import { linkIn, waitForMail } from '../support/mailbox';
import { signIn } from './pages/staff';

const TZ = 'America/Denver';
const PHONE = { width: 390, height: 844 };
const id = () => randomBytes(12).toString('base64url');
const sha256 = (v: string) => createHash('sha256').update(v).digest('hex');

function firmDay(offset: number): string {
	return new Intl.DateTimeFormat('en-CA', { timeZone: TZ }).format(
		new Date(Date.now() + offset * 86_400_000)
	);
}

async function withSql<T>(run: (sql: postgres.Sql) => Promise<T>): Promise<T> {
	const sql = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
	try {
		return await run(sql);
	} finally {
		await sql.end();
	}
}

/** The plan, the season settings (first frost three weeks out, the yard) and a homeowner. */
async function seed(name: string, at: { lat: number; lng: number }, subscribed: boolean) {
	return withSql(async (sql) => {
		const frost = firmDay(21);
		await sql`
			insert into care_season_settings (id, first_frost, shutdown_days, depot_lat, depot_lng, speed_kmh)
			values (1, ${frost.slice(5)}, 60, 40.0, -105.0, 40)
			on conflict (id) do update set first_frost = excluded.first_frost, shutdown_days = 60,
				depot_lat = 40.0, depot_lng = -105.0`;
		const [plan] = await sql<
			{ id: string }[]
		>`select id from care_plans where name = 'Frost-proof care'`;
		const planId = plan?.id ?? id();
		if (!plan) {
			await sql`
				insert into care_plans (id, name, summary, terms, visits, prices, pay_yearly, pay_per_visit)
				values (${planId}, 'Frost-proof care', 'Start-up in spring, shut-down before the frost.',
					'We come once in each window. Cancel any time from your link.',
					${sql.json([
						{ kind: 'startup', minutes: 60, checklist: ['Set the pump', 'Check every outlet'] },
						{
							kind: 'shutdown',
							minutes: 60,
							checklist: ['Drain the lines', 'Store the pump indoors']
						}
					])},
					${sql.json({ fountain: { small: 11000, medium: 14500, large: 19000 } })}, true, true)`;
		}
		const tag = randomBytes(4).toString('hex');
		const email = `${name.split(' ')[0].toLowerCase()}.${tag}@homeowner.example`;
		const contactId = id();
		const propertyId = id();
		const featureId = id();
		await sql`insert into contacts (id, name, email) values (${contactId}, ${name}, ${email})`;
		await sql`insert into properties (id, contact_id, street, town, postal_code)
			values (${propertyId}, ${contactId}, ${`${tag} Birch Lane`}, 'Linden Ford', '80999')`;
		await sql`insert into property_features (id, property_id, kind, size, pump, built_by)
			values (${featureId}, ${propertyId}, 'fountain', 'medium', 'Basin pump 1200', 'others')`;
		await sql`insert into property_locations (property_id, lat, lng, source)
			values (${propertyId}, ${at.lat}, ${at.lng}, 'pin')`;
		const token = randomBytes(20).toString('base64url');
		await sql`insert into care_links (token_hash, property_id) values (${sha256(token)}, ${propertyId})`;
		if (subscribed) {
			await sql`
				insert into care_subscriptions (id, plan_id, property_id, contact_id, billing, status,
					feature_ids, year_cents, typed_name, accepted_at, starts_on, renews_on)
				values (${id()}, ${planId}, ${propertyId}, ${contactId}, 'visit', 'active', ${[featureId]},
					29000, ${name}, now(), ${firmDay(-30)}, ${firmDay(335)})`;
		}
		return { email, token, street: `${tag} Birch Lane`, season: `autumn-${frost.slice(0, 4)}` };
	});
}

async function noSideways(page: Page) {
	const [scroll, client] = await page.evaluate(() => [
		document.documentElement.scrollWidth,
		document.documentElement.clientWidth
	]);
	expect(scroll).toBeLessThanOrEqual(client);
}

test('a homeowner signs up for a care plan on a phone and pays by card', async ({
	browser
}, testInfo) => {
	const home = await seed('Odile Ferrand', { lat: 40.03, lng: -105.01 }, false);
	const context = await browser.newContext({ viewport: PHONE });
	const page = await context.newPage();
	await page.goto(`/care/${home.token}`);
	await expect(page.getByRole('heading', { name: 'Seasonal care' })).toBeVisible();
	const offer = page.locator('section', {
		has: page.getByRole('heading', { name: 'Frost-proof care' })
	});
	// A medium fountain: start-up and shut-down at 145.00 each.
	await expect(offer.getByText('For a year: $290.00')).toBeVisible();
	await noSideways(page);
	await page.screenshot({ path: testInfo.outputPath('care-offer-390.png'), fullPage: true });

	await offer.getByRole('button', { name: 'Sign up for Frost-proof care' }).click();
	await expect(offer.getByText('Tick the box to accept the terms')).toBeVisible();
	await offer.getByLabel('Pay the year now by card ($290.00)').check();
	await offer.getByLabel('I accept the terms of “Frost-proof care”').check();
	await offer.getByLabel('Your full name').fill('Odile Ferrand');
	await offer.getByRole('button', { name: 'Sign up for Frost-proof care' }).click();

	await expect(page.getByText('Local test payment page')).toBeVisible();
	await page.getByRole('button', { name: 'Pay $290.00' }).click();
	await expect(page).toHaveURL(new RegExp(`/care/${home.token}/paid\\?session=cs_test_`));
	await expect(page.getByRole('heading', { name: 'Thank you: payment received' })).toBeVisible();
	await page.getByRole('link', { name: 'Back to your care plan' }).click();
	await expect(page.getByTestId('plan-state')).toContainText('Paid by the year ($290.00)');
	const welcome = await waitForMail(home.email, /Your care plan: Frost-proof care/);
	expect(welcome.text).toContain('The year is paid ($290.00)');
	await context.close();
});

test('the owner plans the autumn and moves a visit; the crew lead completes it on a phone; the homeowner gets the report', async ({
	browser
}, testInfo) => {
	const near = await seed('Pell Aransen', { lat: 40.02, lng: -105.0 }, true);
	const far = await seed('Quill Ostrander', { lat: 40.05, lng: -105.02 }, true);
	const [day1, day2] = [firmDay(1), firmDay(2)];

	const owner = await browser.newPage();
	await signIn(owner, 'owner');
	await owner.goto(`/office/care/season?season=${near.season}`);
	await owner.getByRole('button', { name: "Make the season's visits from the plans" }).click();
	await expect(owner.getByText(/new visits; \d+ in the season/)).toBeVisible();
	const days = owner.locator('form[action="?/crewDays"]');
	await days.getByLabel('First day').fill(day1);
	await days.getByLabel('Last day').fill(day2);
	await days.getByLabel('Weekdays only').uncheck();
	await days.getByLabel('Crew lead').selectOption({ label: 'Rosa Lindqvist' });
	await days.getByRole('button', { name: 'Add the days' }).click();
	await expect(days.getByText(/crew days added/)).toBeVisible();
	await owner.getByRole('button', { name: 'Propose a schedule' }).click();
	await expect(owner.getByText(/visits placed/)).toBeVisible();

	const first = owner.getByTestId(`crew-day-${day1}`);
	const second = owner.getByTestId(`crew-day-${day2}`);
	await expect(first.getByTestId('visit-row').filter({ hasText: near.street })).toBeVisible();
	await expect(first.getByTestId('visit-row').filter({ hasText: far.street })).toBeVisible();
	// Move the farther homeowner's visit to the second day.
	const farRow = first.getByTestId('visit-row').filter({ hasText: far.street });
	await farRow
		.getByRole('combobox')
		.selectOption({ index: await dayIndex(farRow.getByRole('combobox'), day2) });
	await farRow.getByRole('button', { name: 'Move' }).click();
	await expect(second.getByTestId('visit-row').filter({ hasText: far.street })).toBeVisible();
	await expect(first.getByTestId('visit-row').filter({ hasText: far.street })).toHaveCount(0);
	await owner.getByRole('button', { name: /Mail the dates to homeowners/ }).click();
	await expect(owner.getByText(/mailed the date/)).toBeVisible();
	const dated = await waitForMail(near.email, /^Your autumn shut-down: /);
	expect(linkIn(dated, /^\/care\/visit\//)).toBeTruthy();
	await owner.close();

	// Rosa on her phone: the visit is on her Today page.
	const crewContext = await browser.newContext({ viewport: PHONE });
	const crew = await crewContext.newPage();
	await signIn(crew, 'crew');
	const service = crew.locator('section[aria-labelledby="service-heading"]');
	await service.getByRole('link', { name: /Autumn shut-down: Pell Aransen/ }).click();
	await expect(crew.getByRole('heading', { name: 'Autumn shut-down' })).toBeVisible();
	await expect(crew.getByText('Basin pump 1200')).toBeVisible();
	await crew.getByRole('button', { name: 'Done: send the report' }).click();
	await expect(crew.getByText('2 checklist items are not ticked yet.')).toBeVisible();
	for (const item of ['Drain the lines', 'Store the pump indoors']) {
		await crew.getByRole('button', { name: item }).click();
		await expect(crew.getByRole('button', { name: item })).toHaveAttribute('aria-pressed', 'true');
	}
	await crew.getByLabel('Add a photo').setInputFiles({
		name: 'drained-basin.jpg',
		mimeType: 'image/jpeg',
		buffer: await yardJpeg(800, 600)
	});
	await crew.getByRole('button', { name: 'Upload' }).click();
	await expect(crew.getByRole('img', { name: 'Taken on this visit' })).toBeVisible();
	await crew
		.getByLabel('Notes for the homeowner and the office')
		.fill('Pump stored in the garage.');
	await crew.getByRole('button', { name: 'Save the notes' }).click();
	await expect(crew.getByText('Saved.')).toBeVisible();
	await noSideways(crew);
	await crew.screenshot({
		path: testInfo.outputPath('crew-service-visit-390.png'),
		fullPage: true
	});
	const body = await crew.locator('body').innerText();
	expect(body).not.toMatch(/\$\s?\d/);
	await crew.getByRole('button', { name: 'Done: send the report' }).click();
	await expect(crew.getByText('Done. The homeowner has the report.')).toBeVisible();
	await crewContext.close();

	// The homeowner's report: the checklist, the photo attached and, billed per visit, a pay link.
	const report = await waitForMail(near.email, /Autumn shut-down done at/);
	expect(report.text).toContain('✓ Drain the lines');
	expect(report.text).toContain('Pump stored in the garage.');
	expect(report.text).toContain('Invoice for this visit: $145.00');
	expect(report.attachments?.map((a) => a.contentType)).toEqual(['image/webp']);
	const homeContext = await browser.newContext({ viewport: PHONE });
	const home = await homeContext.newPage();
	await home.goto(linkIn(report, /^\/care\/visit\//));
	await expect(home.getByTestId('visit-total')).toHaveText('$145.00');
	await expect(home.getByRole('button', { name: 'Pay $145.00 by card' })).toBeVisible();
	await homeContext.close();
});

/** The option index of a crew day in a move list (options read "Tue, Sep 7, 2027 · Rosa …"). */
async function dayIndex(select: ReturnType<Page['getByRole']>, day: string): Promise<number> {
	const label = new Intl.DateTimeFormat('en-US', {
		weekday: 'short',
		month: 'short',
		day: 'numeric',
		year: 'numeric',
		timeZone: 'UTC'
	}).format(new Date(`${day}T12:00:00Z`));
	const options = await select.locator('option').allInnerTexts();
	const i = options.findIndex((o) => o.startsWith(label));
	expect(i, `a crew day ${label} in ${options.join(' | ')}`).toBeGreaterThanOrEqual(0);
	return i;
}
