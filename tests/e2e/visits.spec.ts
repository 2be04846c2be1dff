// Site visits: the salesperson (demo Teo) books a visit on a demo lead, the homeowner
// confirms through the link in the invitation, the visit is moved and cancelled, every mail carries
// an .ics invitation; the visit notes are typed at a phone viewport and saved, with a photo whose
// thumbnail shows on the agenda card and with the notes on the lead page; the first mailed link
// survives the move and says "cancelled" at the end; availability is each salesperson's own.
import sharp from 'sharp';
import { expect, test, type Locator, type Page } from '@playwright/test';
import { clearMail, linkIn, waitForMail } from '../support/mailbox';
import { demoUser, signIn } from './pages/staff';

const HOMEOWNER = { name: 'Oren Blackwood', email: 'oren.blackwood@example.test' };

/** maildev's REST JSON names an attachment by fileName or generatedFileName. */
type Attached = { fileName?: string; generatedFileName?: string; contentType: string };

function hasIcs(mail: { attachments?: Attached[] }): boolean {
	return (mail.attachments ?? []).some(
		(a) =>
			/\.ics$/.test(a.fileName ?? a.generatedFileName ?? '') &&
			a.contentType.startsWith('text/calendar')
	);
}

/** The demo firm's zone (scripts/seed): the agenda's ?day= is a date there. */
const FIRM_TZ = 'America/Denver';

/** An image that is really on screen: loaded through its signed link, not a broken icon. */
async function expectLoaded(img: Locator): Promise<void> {
	await expect(img).toBeVisible();
	// Thumbnails load lazily: a photo below the fold loads once it is scrolled to.
	await img.scrollIntoViewIfNeeded();
	await expect
		.poll(() => img.evaluate((el) => (el as HTMLImageElement).naturalWidth))
		.toBeGreaterThan(0);
}

async function pickSlot(page: Page, notThis = ''): Promise<string> {
	const radios = page.locator('input[name="startsAt"]');
	await expect(radios.first()).toBeAttached();
	const values = await radios.evaluateAll((els) => els.map((e) => (e as HTMLInputElement).value));
	const value = values.find((v) => v !== notThis)!;
	await page.locator(`label:has(input[name="startsAt"][value="${value}"])`).click();
	return value;
}

test('sales books, the homeowner confirms, sales moves and cancels; notes on a phone', async ({
	page
}) => {
	await clearMail();
	const teo = demoUser('sales');
	await signIn(page, 'sales');
	await page.goto(`/office/leads?q=${encodeURIComponent(HOMEOWNER.name)}`);
	await page.getByRole('link', { name: HOMEOWNER.name }).click();
	await page.getByRole('link', { name: 'Book a site visit' }).click();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(
		`Site visit for ${HOMEOWNER.name}`
	);
	await expect(page.getByLabel('Salesperson')).toHaveValue(/.+/);
	await page.getByLabel('Salesperson').selectOption({ label: teo.name });
	const first = await pickSlot(page);
	await page.getByLabel(/Note for the homeowner/).fill('Please leave the side gate unlatched.');
	await page.getByRole('button', { name: 'Confirm the visit' }).click();
	await expect(page.getByRole('status')).toContainText('Visit booked');
	await expect(page.getByText('Not yet confirmed by the homeowner.')).toBeVisible();

	const booked = await waitForMail(HOMEOWNER.email, /^Site visit booked/);
	expect(hasIcs(booked)).toBe(true);
	expect(booked.text).toContain('Please leave the side gate unlatched.');
	expect(hasIcs(await waitForMail(teo.email, /^Site visit booked/))).toBe(true);

	// The homeowner, signed out in a context of their own, confirms through the private link.
	const homeowner = await page.context().browser()!.newPage();
	await homeowner.goto(linkIn(booked, /^\/visit\//));
	await homeowner.getByRole('button', { name: 'Confirm the visit' }).click();
	await expect(homeowner.getByText('You have confirmed this time.')).toBeVisible();
	await homeowner.close();
	await page.reload();
	await expect(page.getByText('The homeowner confirmed.')).toBeVisible();

	// Move it to another free time.
	await expect(page.getByRole('heading', { name: 'Move the visit' })).toBeVisible();
	const second = await pickSlot(page, first);
	await page.getByRole('button', { name: 'Move the visit' }).click();
	await expect(page.getByRole('status')).toContainText('Visit moved');
	const moved = await waitForMail(HOMEOWNER.email, /^Site visit moved/);
	expect(hasIcs(moved)).toBe(true);
	expect(hasIcs(await waitForMail(teo.email, /^Site visit moved/))).toBe(true);

	// The visit notes, on a phone at the site.
	await page.setViewportSize({ width: 390, height: 844 });
	await page.getByRole('link', { name: 'Visit notes' }).click();
	await expect(page.getByRole('heading', { name: 'Visit notes' })).toBeVisible();
	await page.getByLabel('Spot length (ft)').fill('14');
	await page.getByLabel('Spot width (ft)').fill('9.5');
	await page.getByLabel('Distance to patio (ft)').fill('6');
	const form = page.locator('form[action="?/notes"]');
	await expect(form).toContainText('Local codes and licensed practice come first');
	await page.getByLabel('Slope', { exact: true }).selectOption('steep');
	await expect(form).toContainText('A steep slope is levelled with a retaining wall');
	await page.getByLabel('Slope', { exact: true }).selectOption('gentle');
	await expect(form).not.toContainText('Retaining wall height');
	await page.getByLabel('Access width for machines and stones (in)').fill('38');
	await expect(form).toContainText(
		'brought in through the 38 in access weigh more than one person'
	);
	await page.getByLabel('Locate request (811) made').selectOption('no');
	await page.getByLabel('Where power is').fill('Outlet on the garage wall, 40 ft');
	// Too long a note is refused beside the field, and everything typed stays.
	await page.getByLabel('Notes', { exact: true }).fill('x'.repeat(2001));
	await page.getByRole('button', { name: 'Save notes' }).click();
	await expect(page.getByText('Keep this under 2000 characters')).toBeVisible();
	await expect(page.getByLabel('Notes', { exact: true })).toHaveAttribute('aria-invalid', 'true');
	await expect(page.getByLabel('Spot width (ft)')).toHaveValue('9.5');
	await expect(page.getByLabel('Slope', { exact: true })).toHaveValue('gentle');
	await expect(page.getByLabel('Where power is')).toHaveValue('Outlet on the garage wall, 40 ft');
	await page.getByLabel('Notes', { exact: true }).fill('Gate 38 in wide; a mini loader fits.');
	const width = await page.evaluate(() => document.documentElement.scrollWidth);
	expect(width, 'no sideways scrolling at 390 px').toBeLessThanOrEqual(390);
	await page.getByRole('button', { name: 'Save notes' }).click();
	await expect(page.getByText('Notes saved.')).toBeVisible();
	await page.reload();
	await expect(page.getByLabel('Spot width (ft)')).toHaveValue('9.5');
	await expect(page.getByLabel('Where power is')).toHaveValue('Outlet on the garage wall, 40 ft');
	await expect(page.getByLabel('Slope', { exact: true })).toHaveValue('gentle');

	// A photo of the spot, taken on the phone.
	const png = await sharp({
		create: { width: 900, height: 600, channels: 3, background: '#6f8f5a' }
	})
		.png()
		.toBuffer();
	await page
		.locator('input[name="photo"]')
		.setInputFiles({ name: 'side-gate.png', mimeType: 'image/png', buffer: png });
	await page.getByRole('button', { name: 'Upload photo' }).click();
	await expect(page.getByText('Photo added.')).toBeVisible();
	await expectLoaded(page.getByRole('img', { name: 'Visit photo side-gate.png' }));
	const notesPath = new URL(page.url()).pathname; // the plain upload post left ?/photo on it

	// The agenda card of that day shows the thumbnail, still at phone width.
	const day = new Intl.DateTimeFormat('en-CA', { timeZone: FIRM_TZ }).format(new Date(second));
	await page.goto(`/office/visits?day=${day}&view=day&person=all`);
	const card = page.locator('article').filter({ hasText: HOMEOWNER.name });
	await expectLoaded(card.getByRole('img', { name: 'Visit photo: side-gate.png' }));
	const agendaWidth = await page.evaluate(() => document.documentElement.scrollWidth);
	expect(agendaWidth, 'agenda fits 390 px with thumbnails').toBeLessThanOrEqual(390);
	await page.screenshot({ path: test.info().outputPath('agenda-390.png'), fullPage: true });
	await page.emulateMedia({ media: 'print' });
	await expect(card.getByRole('img', { name: 'Visit photo: side-gate.png' })).toBeHidden();
	await expect(card).toContainText(HOMEOWNER.name);
	await page.emulateMedia({ media: 'screen' });

	// The lead page shows the notes, read-only, with the cautions and the photo.
	await page.setViewportSize({ width: 1280, height: 900 });
	await page.goto(`/office/leads?q=${encodeURIComponent(HOMEOWNER.name)}`);
	await page.getByRole('link', { name: HOMEOWNER.name }).click();
	const summary = page.getByRole('region', { name: 'Site visit notes' });
	await expect(summary).toContainText('14 ft long × 9.5 ft wide');
	await expect(summary).toContainText('Outlet on the garage wall, 40 ft');
	await expect(summary).toContainText('gentle');
	await expect(summary).toContainText('Gate 38 in wide; a mini loader fits.');
	await expect(summary).toContainText('Locate request not made yet.');
	await expect(summary).toContainText('licensed electrician');
	await expect(summary).toContainText('Heavy stones: lift safely');
	await expect(summary).toContainText('Local codes and licensed practice come first');
	await expectLoaded(summary.getByRole('img', { name: 'Visit photo: side-gate.png' }));
	await summary.screenshot({ path: test.info().outputPath('lead-visit-notes.png') });
	// Not also among the inquiry's photos.
	await expect(
		page.getByRole('region', { name: 'Photos of the spot' }).getByRole('img')
	).toHaveCount(0);
	await summary.getByRole('link', { name: 'Open the visit notes' }).click();
	await expect(page).toHaveURL((url) => url.pathname === notesPath);

	// Delete the photo again: the first tap only asks.
	await page.getByText('Delete…').click();
	await page.getByRole('button', { name: 'Yes, delete it' }).click();
	await expect(page.getByText('Photo deleted.')).toBeVisible();
	await expect(page.getByRole('img', { name: 'Visit photo side-gate.png' })).toHaveCount(0);
	await expect(page.getByText('No photos from this visit yet.')).toBeVisible();

	// Cancel from the booking page.
	await page.getByRole('link', { name: 'Move or cancel' }).click();
	await page.getByLabel(/Reason for cancelling/).fill('Homeowner travelling; will call back');
	await page.getByRole('button', { name: 'Cancel the visit' }).click();
	await expect(page.getByRole('status')).toContainText('Visit cancelled');
	await expect(page.getByRole('heading', { name: 'Book a visit' })).toBeVisible();
	const cancelled = await waitForMail(HOMEOWNER.email, /^Site visit cancelled/);
	expect(hasIcs(cancelled)).toBe(true);
	expect(hasIcs(await waitForMail(teo.email, /^Site visit cancelled/))).toBe(true);

	// The link from the very first e-mail survived the move and now says the visit is cancelled.
	const late = await page.context().browser()!.newPage();
	await late.goto(linkIn(booked, /^\/visit\//));
	await expect(late.getByRole('heading', { name: 'This visit is cancelled' })).toBeVisible();
	await expect(late.getByRole('button', { name: 'Confirm the visit' })).toHaveCount(0);
	await late.close();
});

test('a salesperson edits their own availability, with messages beside the fields', async ({
	page
}) => {
	await signIn(page, 'sales');
	await page.goto('/office/availability');
	await expect(page.getByRole('heading', { name: /Weekly hours of Teo/ })).toBeVisible();
	await expect(page.getByLabel('Salesperson')).toHaveCount(0);
	await page.locator('input[name="weeklyHours.3.0.start"]').fill('15:00');
	await page.locator('input[name="weeklyHours.3.0.end"]').fill('09:00');
	await page.getByLabel('Visit length (minutes)').fill('5');
	await page.getByRole('button', { name: 'Save hours and rules' }).click();
	await expect(page.locator('#weeklyHours\\.3\\.0\\.end-error')).toHaveText(
		'The end must come after the start'
	);
	await expect(page.locator('#visitMinutes-error')).toHaveText('At least 15 minutes');
	await page.locator('input[name="weeklyHours.3.0.start"]').fill('09:00');
	await page.locator('input[name="weeklyHours.3.0.end"]').fill('15:00');
	await page.getByLabel('Visit length (minutes)').fill('75');
	await page.getByRole('button', { name: 'Save hours and rules' }).click();
	await expect(page.getByRole('status')).toContainText('Saved the hours and rules of Teo');
	await page.reload();
	await expect(page.getByLabel('Visit length (minutes)')).toHaveValue('75');
	await expect(page.locator('input[name="weeklyHours.3.0.end"]')).toHaveValue('15:00');

	await page.getByLabel('First day').fill('2031-05-05');
	await page.getByLabel('Last day').fill('2031-05-06');
	await page.getByLabel(/^Reason/).fill('Stone show');
	await page.getByRole('button', { name: 'Add time off' }).click();
	const entry = page.getByRole('listitem').filter({ hasText: 'Stone show' });
	await expect(entry).toBeVisible();
	await entry.getByRole('button', { name: 'Remove' }).click();
	await expect(entry).toHaveCount(0);

	// The owner picks anyone; another person's availability is refused to Teo on the server.
	const ownerPage = await page.context().browser()!.newPage();
	await signIn(ownerPage, 'owner', '/office/availability');
	await ownerPage.getByLabel('Salesperson').selectOption({ label: demoUser('owner').name });
	await ownerPage.getByRole('button', { name: 'Show' }).click();
	await expect(ownerPage.getByRole('heading', { name: /Weekly hours of Mara/ })).toBeVisible();
	const mara = new URL(ownerPage.url()).searchParams.get('person')!;
	await ownerPage.close();
	const seen = await page.request.get(`/office/availability?person=${mara}`);
	expect(seen.status()).toBe(403);
	const written = await page.request.post(`/office/availability?/rules&person=${mara}`, {
		form: { visitMinutes: '60', bufferMinutes: '30', noticeMinutes: '120', daysAhead: '21' },
		headers: { origin: new URL(page.url()).origin },
		maxRedirects: 0
	});
	expect(written.status()).toBe(403);
});
