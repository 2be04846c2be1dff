// SQL-injection and script-injection strings through every search, filter and free-text field:
// no 500, the text stored exactly as typed, and wherever it is shown, shown as text (the page
// contains it, no element it describes exists, no dialog opens, no script of it ran).
import { createHash, randomBytes } from 'node:crypto';
import postgres from 'postgres';
import { expect, request, test, type APIRequestContext, type Page } from '@playwright/test';
import { linkIn, waitForMail } from '../support/mailbox';
import { seedAcceptedJob } from '../support/accepted-job';
import { apiAs, demoUser, signIn } from './pages/staff';

const sql = postgres(process.env.E2E_DATABASE_URL ?? process.env.DATABASE_URL!, {
	max: 2,
	onnotice: () => {}
});
test.afterAll(async () => {
	await sql.end();
});

const tag = randomBytes(3).toString('hex');
const SQLI = [
	`' OR 1=1 --`,
	`'; drop table leads; --`,
	`%_\\`,
	`1) or (1=1`,
	`' union select 1 --`
];
const SCRIPT = [
	`<script>window.__xss=1</script>`,
	`"><img src=x onerror="window.__xss=1;alert(1)">`,
	`javascript:window.__xss=1`,
	`<svg onload=alert(1)>`
];
/** One string with every trick in it, and a tag so each test finds its own rows. */
const evil = (field: string) =>
	`${field}-${tag} "><img src=x onerror=alert(1)><script>alert(2)</script><svg onload=alert(3)> ' OR 1=1 -- '; drop table leads; -- %_\\ javascript:alert(4)`;
/** For fields of at most 60 characters. */
const shortEvil = (field: string) => `${field}${tag}"><img src=x onerror=alert(1)>' OR 1=1--`;

/** Opens a page and checks the text is shown literally and none of its markup became elements. */
async function expectShownAsText(page: Page, path: string, texts: string[]) {
	const dialogs: string[] = [];
	const onDialog = (d: { message(): string; dismiss(): Promise<void> }) => {
		dialogs.push(d.message());
		void d.dismiss();
	};
	page.on('dialog', onDialog);
	const res = await page.goto(path);
	expect(res?.status(), path).toBe(200);
	// What a person sees: text outside scripts, and the values of form fields (tables that load
	// their rows in the browser get a moment to do so).
	const shown = () =>
		page.evaluate(() => {
			const parts: string[] = [];
			const walker = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT);
			for (let n = walker.nextNode(); n; n = walker.nextNode()) {
				if (!n.parentElement?.closest('script, style')) parts.push(n.textContent ?? '');
			}
			for (const field of document.querySelectorAll('input, textarea')) {
				parts.push((field as HTMLInputElement).value);
			}
			return parts.join('\n');
		});
	for (const text of texts) {
		await expect.poll(shown, { message: `${path} shows it`, timeout: 10_000 }).toContain(text);
	}
	await expect(page.locator('img[src="x"]')).toHaveCount(0);
	await expect(page.locator('svg[onload]')).toHaveCount(0);
	await expect(page.locator('[onerror]')).toHaveCount(0);
	expect(await page.evaluate(() => (window as { __xss?: number }).__xss)).toBeUndefined();
	expect(dialogs).toEqual([]);
	page.off('dialog', onDialog);
}

/** Posts a form action the way `use:enhance` does and returns its outcome (never a 500). */
async function act(
	ctx: APIRequestContext,
	path: string,
	form: Record<string, string>
): Promise<{ type: string; status?: number }> {
	const res = await ctx.post(path, {
		form,
		headers: { accept: 'application/json', 'x-sveltekit-action': 'true' },
		maxRedirects: 0
	});
	expect(res.status(), `${path} answered ${res.status()}: ${await res.text()}`).toBeLessThan(500);
	return res.json();
}

async function makeLead(name: string) {
	const id = `inj-${randomBytes(6).toString('hex')}`;
	const email = `${id}@homeowner.example`;
	const [sales] = await sql`select id from users where role = 'sales' order by created_at limit 1`;
	await sql`insert into contacts (id, name, email) values (${'c-' + id}, ${name}, ${email})`;
	await sql`insert into leads (id, contact_id, stage, services, message, assignee_id)
		values (${id}, ${'c-' + id}, 'visit_booked', ${['bubbler']}, ${evil('seeded')}, ${sales.id})`;
	return { id, email };
}

test('the leads API answers every injected query parameter with 400 or a safe result', async ({
	baseURL
}) => {
	const owner = await apiAs(baseURL!, 'owner');
	const all = (await (await owner.get('/api/leads')).json()) as { total: number };
	expect(all.total).toBeGreaterThan(0);
	const params = ['q', 'sort', 'dir', 'stage', 'service', 'assignee', 'budget', 'from', 'to'];
	for (const param of [...params, 'awaiting', 'page', 'size', `x' or '1'='1`]) {
		for (const value of [...SQLI, ...SCRIPT]) {
			const res = await owner.get(`/api/leads?${new URLSearchParams({ [param]: value })}`);
			expect([200, 400], `${param}=${value}`).toContain(res.status());
			const body = await res.json();
			if (res.status() === 400) {
				expect(JSON.stringify(body)).not.toContain('<script>');
				continue;
			}
			// Only free text may pass: a search, or a filter value that simply matches nothing.
			expect(['q', 'service', 'assignee', 'budget'], `${param}=${value}`).toContain(param);
			expect(body.total, `${param}=${value} matched like a wildcard`).toBeLessThan(all.total);
		}
	}
	// The search treats % _ and \ as the characters they are.
	for (const wildcard of ['%', '_', '\\', '%%']) {
		const res = await owner.get(`/api/leads?${new URLSearchParams({ q: wildcard })}`);
		expect(res.status()).toBe(200);
		expect((await res.json()).total, `q=${wildcard}`).toBeLessThan(all.total);
	}
	// The CSV export and the visit slots read the same kind of parameters.
	for (const value of [...SQLI, ...SCRIPT]) {
		const csv = await owner.get(`/office/leads/export.csv?${new URLSearchParams({ q: value })}`);
		expect([200, 400]).toContain(csv.status());
		const slots = await owner.get(
			`/api/visits/slots?${new URLSearchParams({ salespersonId: value, date: value, timeZone: value })}`
		);
		expect([200, 400, 404]).toContain(slots.status());
	}
	await owner.dispose();
});

test('an inquiry full of injection strings is stored as typed and shown as text in the office', async ({
	browser,
	page
}) => {
	const context = await browser.newContext({ javaScriptEnabled: false });
	const prospect = await context.newPage();
	const email = `inj-${tag}@example.test`;
	// A reflected parameter first: the project reference is looked up, never echoed as markup.
	const ref = await prospect.goto(`/start?ref=${encodeURIComponent(SCRIPT[1])}`);
	expect(ref?.status()).toBe(200);
	await expect(prospect.locator('img[src="x"]')).toHaveCount(0);

	await prospect.goto('/start');
	const shownAt = Date.now();
	await prospect.getByLabel('Your name').fill(evil('name').slice(0, 120));
	await prospect.getByLabel('E-mail', { exact: true }).fill(email);
	await prospect.getByLabel('Street address').fill(evil('street'));
	await prospect.getByLabel('Town').fill(evil('town').slice(0, 120));
	await prospect.getByLabel('Pond', { exact: true }).check();
	await prospect.getByLabel('Budget').selectOption('15k-30k');
	await prospect.getByLabel('When').selectOption('this-season');
	await prospect.getByLabel('Tell us about it (optional)').fill(evil('message'));
	await prospect.getByRole('checkbox', { name: /may call or e-mail me/ }).check();
	const wait = 3_200 - (Date.now() - shownAt);
	if (wait > 0) await prospect.waitForTimeout(wait);
	await prospect.getByRole('button', { name: 'Send my inquiry' }).click();
	await expect(prospect).toHaveURL(/\/start\/thanks\?n=\d+/);
	await context.close();

	const [lead] = await sql`select l.id, l.message, c.name, p.street, p.town
		from leads l join contacts c on c.id = l.contact_id left join properties p on p.id = l.property_id
		where c.email = ${email}`;
	expect(lead.name).toBe(evil('name').slice(0, 120));
	expect(lead.message).toBe(evil('message'));
	expect(lead.street).toBe(evil('street'));
	expect(lead.town).toBe(evil('town').slice(0, 120));
	expect((await sql`select count(*)::int as n from leads`)[0].n).toBeGreaterThan(1);

	// The mails carry it escaped in their HTML part.
	const ack = await waitForMail(email, /R-\d+/);
	expect(ack.html).not.toContain('<img src=x');
	expect(ack.html).not.toContain('<script>alert');

	await signIn(page, 'owner');
	await expectShownAsText(page, `/office/leads/${lead.id}`, [evil('message'), evil('street')]);
	await expectShownAsText(page, `/office/leads?q=${encodeURIComponent(`name-${tag}`)}`, [
		evil('name').slice(0, 120)
	]);
	await expectShownAsText(page, '/office', [`name-${tag}`]);

	// The search finds it by the very characters an injection would use.
	const api = await page.request.get(`/api/leads?${new URLSearchParams({ q: `${tag} "><img` })}`);
	expect(api.status()).toBe(200);
	expect((await api.json()).rows.map((r: { id: string }) => r.id)).toContain(lead.id);
});

test('lead notes, calls, details and the close note keep the strings and show them as text', async ({
	baseURL,
	page
}) => {
	const lead = await makeLead(evil('contact'));
	const sales = await apiAs(baseURL!, 'sales');
	const path = `/office/leads/${lead.id}`;
	expect(await act(sales, `${path}?/log`, { kind: 'note', body: evil('note') })).toMatchObject({
		type: 'success'
	});
	expect(await act(sales, `${path}?/log`, { kind: 'call', body: evil('call') })).toMatchObject({
		type: 'success'
	});
	// A stage or kind outside the list is refused, not written.
	expect(await act(sales, `${path}?/log`, { kind: SQLI[0], body: 'x' })).toMatchObject({
		type: 'failure'
	});
	const [{ version }] = await sql`select version from leads where id = ${lead.id}`;
	expect(
		await act(sales, `${path}?/details`, {
			version: String(version),
			name: evil('details').slice(0, 120),
			email: lead.email,
			phone: '555 010 7788',
			street: evil('detailstreet'),
			town: SQLI[1],
			postalCode: `%_\\`,
			siteNotes: evil('sitenotes')
		})
	).toMatchObject({ type: 'success' });
	expect(await act(sales, `${path}?/details`, { version: SQLI[0], name: 'x' })).toMatchObject({
		type: 'failure'
	});
	const [{ version: v2 }] = await sql`select version from leads where id = ${lead.id}`;
	expect(
		await act(sales, `${path}?/stage`, {
			version: String(v2),
			stage: 'closed',
			closeReason: 'other',
			closeNote: evil('closenote')
		})
	).toMatchObject({ type: 'success' });
	await sales.dispose();

	const notes = await sql`select body from activities where lead_id = ${lead.id}`;
	const bodies = notes.map((n) => n.body as string);
	expect(bodies).toContain(evil('note'));
	expect(bodies).toContain(evil('call'));
	const [row] = await sql`select c.name, p.street, p.town, p.postal_code, p.site_notes
		from leads l join contacts c on c.id = l.contact_id left join properties p on p.id = l.property_id
		where l.id = ${lead.id}`;
	expect(row).toMatchObject({
		name: evil('details').slice(0, 120),
		street: evil('detailstreet'),
		town: SQLI[1],
		postal_code: `%_\\`,
		site_notes: evil('sitenotes')
	});
	expect((await sql`select count(*)::int as n from leads`)[0].n).toBeGreaterThan(1);

	await signIn(page, 'sales');
	await expectShownAsText(page, path, [
		evil('note'),
		evil('call'),
		evil('details').slice(0, 120),
		evil('detailstreet'),
		evil('sitenotes')
	]);
});

test('the leads CSV export neutralises formulas and keeps the other strings as text', async ({
	baseURL
}) => {
	const formula = `=HYPERLINK("http://evil.example","csv${tag}")`;
	await makeLead(formula);
	const owner = await apiAs(baseURL!, 'owner');
	const res = await owner.get(
		`/office/leads/export.csv?${new URLSearchParams({ q: `csv${tag}` })}`
	);
	expect(res.status()).toBe(200);
	const lines = (await res.text()).trim().split('\r\n');
	expect(lines).toHaveLength(2);
	// A spreadsheet opening the file shows the text instead of running it.
	expect(lines[1]).toContain(`"'=HYPERLINK(""http://evil.example"",""csv${tag}"")"`);
	await owner.dispose();
});

test('visit notes keep the strings and show them as text', async ({ baseURL, page }) => {
	const [visit] =
		await sql`select id from site_visits where status = 'booked' order by starts_at desc limit 1`;
	expect(visit, 'the demo seed books visits').toBeTruthy();
	const sales = await apiAs(baseURL!, 'owner');
	const path = `/office/visits/${visit.id}`;
	expect(
		await act(sales, `${path}?/notes`, {
			spotLengthFt: '8',
			spotWidthFt: '6',
			slope: 'gentle',
			powerLocation: evil('power').slice(0, 2000),
			notes: evil('visitnotes')
		})
	).toMatchObject({ type: 'success' });
	expect(
		await act(sales, `${path}?/notes`, { spotLengthFt: SQLI[0], slope: SCRIPT[0] })
	).toMatchObject({ type: 'failure' });
	await sales.dispose();
	const [saved] = await sql`select notes from site_visits where id = ${visit.id}`;
	expect(JSON.stringify(saved.notes)).toContain(JSON.stringify(evil('visitnotes')).slice(1, -1));
	await signIn(page, 'owner');
	await expectShownAsText(page, path, [evil('visitnotes'), evil('power')]);
});

test('estimate scope and typed line text, and the homeowner question and decline reason', async ({
	baseURL,
	page,
	browser
}) => {
	const lead = await makeLead(`Ada Fernhill ${tag}`);
	const sales = await apiAs(baseURL!, 'sales');
	const builder = `/office/leads/${lead.id}/estimate`;
	expect(await act(sales, `${builder}?/create`, {})).toMatchObject({ type: 'redirect' });
	const [{ id }] = await sql`select id from estimates where lead_id = ${lead.id}`;
	const current = await (await sales.get(`/api/estimates/${id}`)).json();
	const line = {
		key: `added-${tag}`,
		kind: 'added',
		bucket: 'base',
		description: evil('line').slice(0, 300),
		unit: 'each',
		quantity: 1,
		unitPriceCents: 1000,
		unitCostCents: 500,
		taxable: true,
		reason: evil('reason').slice(0, 500)
	};
	const put = await sales.put(`/api/estimates/${id}`, {
		data: {
			revision: current.revision,
			design: current.design,
			overrides: [line],
			scope: evil('scope')
		},
		headers: { accept: 'application/json' }
	});
	expect(put.status(), await put.text()).toBe(200);
	// A design or override that breaks the schema is a 400 naming the field, never a 500.
	for (const bad of [
		{ revision: SQLI[0], design: {}, scope: '' },
		{ revision: 2, design: SQLI[1] },
		{ revision: 2, design: {}, overrides: [{ ...line, unit: SCRIPT[0] }] }
	]) {
		const res = await sales.put(`/api/estimates/${id}`, { data: bad });
		expect(res.status(), JSON.stringify(bad)).toBe(400);
	}
	const [stored] = await sql`select scope, overrides from estimates where id = ${id}`;
	expect(stored.scope).toBe(evil('scope'));
	expect((stored.overrides as { description: string }[])[0].description).toBe(line.description);

	await signIn(page, 'sales');
	await expectShownAsText(page, builder, [evil('scope'), line.description]);
	expect(await act(sales, `${builder}?/send`, { estimateId: id })).toMatchObject({
		type: 'success'
	});
	const link = linkIn(await waitForMail(lead.email, /Your estimate from/), /^\/estimate\//);
	const sent = await waitForMail(lead.email, /Your estimate from/);
	expect(sent.html).not.toContain('<img src=x');

	const home = await browser.newPage();
	await expectShownAsText(home, link, [evil('scope'), line.description]);
	const homeowner = await apiAs(baseURL!, null);
	const path = new URL(link).pathname;
	expect(await act(homeowner, `${path}?/question`, { question: evil('question') })).toMatchObject({
		type: 'success'
	});
	expect(await act(homeowner, `${path}?/decline`, { reason: evil('decline') })).toMatchObject({
		type: 'success'
	});
	await homeowner.dispose();
	await home.close();
	const [declined] = await sql`select status, decline_reason from estimates where id = ${id}`;
	expect(declined).toEqual({ status: 'declined', decline_reason: evil('decline') });
	// The salesperson's mails carry the homeowner's words, escaped in the HTML part.
	for (const subject of [/^Question from Ada Fernhill/, /^Declined: Ada Fernhill/]) {
		const mail = await waitForMail(demoUser('sales').email, subject);
		expect(mail.text).toContain(tag);
		expect(mail.html).not.toContain('<img src=x');
		expect(mail.html).toContain('&lt;img src=x');
	}
	await expectShownAsText(page, `/office/leads/${lead.id}`, [evil('question'), evil('decline')]);
	await sales.dispose();
});

test('a price list name keeps the strings and shows them as text', async ({ baseURL, page }) => {
	const owner = await apiAs(baseURL!, 'owner');
	const sku = `INJ-${tag}`;
	const item = {
		sku,
		name: evil('item').slice(0, 200),
		category: 'other',
		unit: 'each',
		unit_cost: '1.00',
		unit_price: '2.00',
		taxable: 'yes',
		tags: SQLI[0]
	};
	const first = await act(owner, '/office/price-list?/item', item);
	expect(first, JSON.stringify(first)).toMatchObject({ type: 'success' });
	expect(await act(owner, '/office/price-list?/item', { ...item, unit: SQLI[1] })).toMatchObject({
		type: 'failure'
	});
	try {
		const [row] = await sql`select name from price_list_items where sku = ${sku}`;
		expect(row.name).toBe(item.name);
		await signIn(page, 'owner');
		await expectShownAsText(page, '/office/price-list', [item.name]);
	} finally {
		// Not left in the catalog other tests price with.
		expect(await act(owner, '/office/price-list?/remove', { sku })).toMatchObject({
			type: 'success'
		});
		await owner.dispose();
	}
});

/** A sold job straight in the database, given to the first crew lead. */
async function seedJob() {
	const [crew] = await sql`select id from users where role = 'crew' order by created_at limit 1`;
	const { jobId } = await seedAcceptedJob(sql, {
		name: `Juniper ${tag}`,
		email: `inj-job-${tag}@homeowner.example`,
		message: 'A drilled boulder by the patio',
		scope: 'Drilled boulder',
		title: 'Drilled boulder',
		totalCents: 980000,
		depositCents: 294000,
		crewLeadId: crew.id
	});
	return jobId;
}

test('punch list items, change orders and a testimonial keep the strings and show them as text', async ({
	baseURL,
	page
}) => {
	const jobId = await seedJob();
	const owner = await apiAs(baseURL!, 'owner');
	const path = `/office/jobs/${jobId}`;
	expect(await act(owner, `${path}?/punch`, { body: evil('punch').slice(0, 500) })).toMatchObject({
		type: 'success'
	});
	const co = new URLSearchParams({
		title: evil('cotitle').slice(0, 120),
		note: evil('conote'),
		'lines.0.description': evil('coline').slice(0, 200),
		'lines.0.category': 'other',
		'lines.0.unit': 'each',
		'lines.0.quantity': '1',
		'lines.0.unitPrice': '120.00'
	});
	expect(await act(owner, `${path}?/changeOrder`, Object.fromEntries(co))).toMatchObject({
		type: 'success'
	});
	expect(await act(owner, `${path}?/punchDone`, { id: SQLI[0] })).not.toMatchObject({
		type: 'success'
	});
	const [punch] = await sql`select body from punch_items where job_id = ${jobId}`;
	expect(punch.body).toBe(evil('punch').slice(0, 500));
	await signIn(page, 'owner');
	await expectShownAsText(page, path, [evil('punch'), evil('cotitle').slice(0, 120)]);

	// The homeowner's kind words, through the mailed link's page, then approved by the owner.
	const token = randomBytes(20).toString('base64url');
	const testimonialId = randomBytes(12).toString('base64url');
	await sql`insert into testimonials (id, job_id, token_hash, token_expires_at)
		values (${testimonialId}, ${jobId}, ${createHash('sha256').update(token).digest('hex')}, now() + interval '30 days')`;
	const homeowner = await apiAs(baseURL!, null);
	const words = {
		body: evil('words'),
		displayName: shortEvil('n'),
		town: shortEvil('t')
	};
	expect(await act(homeowner, `/testimonial/${token}`, words)).toMatchObject({ type: 'success' });
	await homeowner.dispose();
	const [saved] =
		await sql`select body, display_name, town from testimonials where id = ${testimonialId}`;
	expect(saved).toEqual({ body: words.body, display_name: words.displayName, town: words.town });
	await expectShownAsText(page, '/office/jobs/settings', [words.body]);
	expect(
		await act(owner, '/office/jobs/settings?/approve', { id: testimonialId, on: '1' })
	).toMatchObject({ type: 'success' });
	await owner.dispose();
	await expectShownAsText(page, '/kind-words', [words.body, words.displayName]);
});

test('the upload API answers malformed and hostile bodies with a 4xx naming the problem', async ({
	baseURL
}) => {
	const anon = await request.newContext({
		baseURL,
		extraHTTPHeaders: { accept: 'application/json', origin: baseURL! }
	});
	const cases: [string, Parameters<APIRequestContext['post']>[1], number][] = [
		['JSON instead of a form', { data: { file: SCRIPT[0] } }, 400],
		['a form without the file', { multipart: { other: 'x' } }, 400],
		['a text field named file', { multipart: { file: SQLI[0] } }, 400],
		[
			'an SVG with a script',
			{
				multipart: {
					file: {
						name: '"><img src=x onerror=alert(1)>.svg',
						mimeType: 'image/svg+xml',
						buffer: Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"/>')
					}
				}
			},
			415
		],
		[
			'HTML named .jpg',
			{
				multipart: {
					file: {
						name: "x' OR 1=1 --.jpg",
						mimeType: 'image/jpeg',
						buffer: Buffer.from('<script>alert(1)</script>')
					}
				}
			},
			415
		]
	];
	for (const [label, body, status] of cases) {
		const res = await anon.post('/api/uploads', body);
		expect(res.status(), `${label}: ${await res.text()}`).toBe(status);
		// Data, not a page: the browser never renders it as HTML.
		expect(res.headers()['content-type'], label).toMatch(/^application\/json/);
		expect(res.headers()['x-content-type-options']).toBe('nosniff');
	}
	const remove = await anon.delete(`/api/uploads?${new URLSearchParams({ token: SQLI[0] })}`);
	expect(remove.status()).toBe(400);
	await anon.dispose();
});

test('a hostile file name is shown as text beside the photo picker', async ({ page }) => {
	const dialogs: string[] = [];
	page.on('dialog', (d) => {
		dialogs.push(d.message());
		void d.dismiss();
	});
	await page.goto('/start');
	const name = `"><img src=x onerror=alert(1)>${tag}.svg`;
	await page.locator('input[name="photos"][multiple]').setInputFiles({
		name,
		mimeType: 'image/svg+xml',
		buffer: Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"/>')
	});
	await expect(page.getByRole('alert').filter({ hasText: tag })).toContainText(name);
	await expect(page.locator('img[src="x"]')).toHaveCount(0);
	await expect(page.locator('svg[onload]')).toHaveCount(0);
	expect(dialogs).toEqual([]);
});
