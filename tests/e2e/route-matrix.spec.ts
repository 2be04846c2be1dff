// The route-and-role matrix, built from the route tree: a new office or API route that is not
// listed here fails the first test, so none can ship without its expected statuses.
import { resolve } from 'node:path';
import { expect, test, type APIRequestContext } from '@playwright/test';
import { routeFiles } from '../../src/lib/server/http/route-files';
import { apiAs, type DemoRole } from './pages/staff';

type Who = 'anonymous' | DemoRole;
type Expect = Record<Who, number>;

const STAFF: Expect = { anonymous: 303, owner: 200, sales: 200, crew: 200 };
const OWNER_ONLY: Expect = { anonymous: 303, owner: 200, sales: 403, crew: 403 };
const PUBLIC_API: Expect = { anonymous: 200, owner: 200, sales: 200, crew: 200 };
const LEADS: Expect = { anonymous: 303, owner: 200, sales: 200, crew: 403 };

/** Pages and endpoints by URL pattern, with the status each kind of visitor gets on GET. */
const PAGES: Record<string, Expect> = {
	'/office/visits': { anonymous: 303, owner: 200, sales: 200, crew: 403 },
	'/office/visits/[id]': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/leads/[id]/visit': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/api/visits/slots': { anonymous: 401, owner: 400, sales: 400, crew: 403 },
	'/visit/[token]': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	// Availability: each salesperson's own; the owner picks anyone with ?person=.
	'/office/availability': { anonymous: 303, owner: 200, sales: 200, crew: 403 },
	'/office': STAFF,
	'/office/team': OWNER_ONLY,
	'/office/settings': OWNER_ONLY,
	// Estimates: owner and sales; the price list is read by sales, changed by the owner.
	'/office/estimates': { anonymous: 303, owner: 200, sales: 200, crew: 403 },
	'/office/price-list': { anonymous: 303, owner: 200, sales: 200, crew: 403 },
	'/office/price-list/export': { anonymous: 303, owner: 200, sales: 200, crew: 403 },
	'/office/price-list/import': { anonymous: 303, owner: 200, sales: 403, crew: 403 },
	'/office/leads/[id]/estimate': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/api/estimates/[id]': { anonymous: 401, owner: 404, sales: 404, crew: 403 },
	// The homeowner's link: an unknown (or expired, or replaced) token is a plain 404 for everyone.
	'/estimate/[token]': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/office/jobs': STAFF,
	'/office/jobs/settings': OWNER_ONLY,
	// No lead named: 404 for staff who may sell; crew may not sell by hand.
	'/office/jobs/new': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	// An unknown job: 404 for every role allowed on jobs (crew included: ownership is per record).
	'/office/jobs/[id]': { anonymous: 303, owner: 404, sales: 404, crew: 404 },
	'/change-order/[token]': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/testimonial/[token]': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/care/unsubscribe/[token]': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	// Job costing: hours are logged by every role allowed on the job (crew on their own jobs);
	// the phone posts them to the API (POST only). Costing and margins are the owner's.
	'/office/jobs/[id]/time': { anonymous: 303, owner: 404, sales: 404, crew: 404 },
	'/office/jobs/[id]/purchasing': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/jobs/[id]/purchasing/[orderId]/pdf': {
		anonymous: 303,
		owner: 404,
		sales: 404,
		crew: 403
	},
	'/api/jobs/[id]/time': { anonymous: 401, owner: 405, sales: 405, crew: 405 },
	'/office/costing': OWNER_ONLY,
	'/office/costing/export.csv': OWNER_ONLY,
	'/office/costing/[id]': { anonymous: 303, owner: 404, sales: 403, crew: 403 },
	'/office/callbacks': STAFF,
	'/office/callbacks/[id]': { anonymous: 303, owner: 404, sales: 404, crew: 404 },
	'/callback/[token]': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/api/health': PUBLIC_API,
	// Payments: owner only; the webhook is POST-only and public; token pages 404 on a bad token.
	'/office/payments': OWNER_ONLY,
	'/office/payments/[jobId]': { anonymous: 303, owner: 404, sales: 403, crew: 403 },
	'/office/payments/invoices/[number]': { anonymous: 303, owner: 404, sales: 403, crew: 403 },
	'/api/payments/webhook': { anonymous: 405, owner: 405, sales: 405, crew: 405 },
	'/pay/[token]': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/pay/[token]/receipt': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/invoice/[token]/[number]': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/api/uploads': PUBLIC_API,
	// Care: owner and sales; plans and seasons are the owner's; crew open their own service visits
	// (an unknown visit is 404 for every role allowed). Homeowner and calendar links 404 on a bad token.
	'/office/care': LEADS,
	'/office/care/plans/[id]': { anonymous: 303, owner: 404, sales: 403, crew: 403 },
	'/office/care/properties/[id]': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/care/season': OWNER_ONLY,
	'/office/care/visits/[id]': { anonymous: 303, owner: 404, sales: 404, crew: 404 },
	'/office/account/calendar': STAFF,
	'/calendar/[token]': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	// The public care sign-up (a site page with a form): open to everyone.
	'/care': { anonymous: 200, owner: 200, sales: 200, crew: 200 },
	'/care/[token]': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/care/[token]/paid': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/care/visit/[token]': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/care/visit/[token]/paid': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	// Leads: owner and sales only; an unknown lead id is a 404.
	'/office/leads': LEADS,
	'/office/leads/export.csv': LEADS,
	'/office/leads/[id]': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/api/leads': { anonymous: 401, owner: 200, sales: 200, crew: 403 }
};

/** Form actions (POST), with the status each gets before any validation. */
const ACTIONS: Record<string, Expect> = {
	// Visits: the empty form is refused before anything is written.
	'/office/availability?/rules': { anonymous: 303, owner: 400, sales: 400, crew: 403 },
	'/office/availability?/addTimeOff': { anonymous: 303, owner: 400, sales: 400, crew: 403 },
	'/office/availability?/removeTimeOff': { anonymous: 303, owner: 400, sales: 400, crew: 403 },
	'/office/visits/[id]?/notes': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/visits/[id]?/photo': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/visits/[id]?/deletePhoto': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	// Jobs: an unknown job is 404 before anything is written; office-only actions 403 crew.
	// Jobs: an empty form fails validation, and the page then renders for an unknown job or token,
	// so a plain (no-JavaScript) post answers the load's 404.
	'/office/jobs/[id]?/schedule': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/jobs/[id]?/ordered': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/jobs/[id]?/picked': { anonymous: 303, owner: 404, sales: 404, crew: 404 },
	'/office/jobs/[id]?/punch': { anonymous: 303, owner: 404, sales: 404, crew: 404 },
	'/office/jobs/[id]?/punchDone': { anonymous: 303, owner: 404, sales: 404, crew: 404 },
	'/office/jobs/[id]?/stage': { anonymous: 303, owner: 404, sales: 404, crew: 404 },
	'/office/jobs/[id]?/photo': { anonymous: 303, owner: 404, sales: 404, crew: 404 },
	'/office/jobs/[id]?/changeOrder': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/jobs/[id]?/sendChangeOrder': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/jobs/new': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/jobs/settings?/care': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/jobs/[id]/time?/add': { anonymous: 303, owner: 404, sales: 404, crew: 404 },
	'/office/jobs/[id]/purchasing?/supplier': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/jobs/[id]/purchasing?/itemSupplier': {
		anonymous: 303,
		owner: 404,
		sales: 404,
		crew: 403
	},
	'/office/jobs/[id]/purchasing?/make': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/jobs/[id]/purchasing?/update': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/jobs/[id]/purchasing?/send': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/jobs/[id]/purchasing?/receive': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/costing?/settings': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/callbacks?/link': { anonymous: 303, owner: 400, sales: 400, crew: 403 },
	'/office/callbacks/[id]?/schedule': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/callbacks/[id]?/hours': { anonymous: 303, owner: 404, sales: 404, crew: 404 },
	'/office/callbacks/[id]?/close': { anonymous: 303, owner: 404, sales: 404, crew: 404 },
	'/callback/[token]': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/office/costing/[id]?/usage': { anonymous: 303, owner: 404, sales: 403, crew: 403 },
	'/office/costing/[id]?/cost': { anonymous: 303, owner: 404, sales: 403, crew: 403 },
	'/office/costing/[id]?/removeCost': { anonymous: 303, owner: 404, sales: 403, crew: 403 },
	'/office/jobs/settings?/approve': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/change-order/[token]': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/testimonial/[token]': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/care/unsubscribe/[token]': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	// Care: empty forms are refused before anything is written; unknown records answer 404.
	'/office/care/plans/[id]': { anonymous: 303, owner: 404, sales: 403, crew: 403 },
	'/office/care/properties/[id]?/addFeature': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/care/properties/[id]?/editFeature': {
		anonymous: 303,
		owner: 404,
		sales: 404,
		crew: 403
	},
	'/office/care/properties/[id]?/removeFeature': {
		anonymous: 303,
		owner: 404,
		sales: 404,
		crew: 403
	},
	'/office/care/properties/[id]?/featurePhoto': {
		anonymous: 303,
		owner: 404,
		sales: 404,
		crew: 403
	},
	'/office/care/properties/[id]?/pin': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/care/properties/[id]?/postal': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/care/properties/[id]?/offer': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/care/season?/settings': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/care/season?/generate': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/care/season?/crewDays': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/care/season?/removeDay': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/care/season?/propose': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/care/season?/move': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/care/season?/mail': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/care/visits/[id]?/tick': { anonymous: 303, owner: 404, sales: 404, crew: 404 },
	'/office/care/visits/[id]?/notes': { anonymous: 303, owner: 404, sales: 404, crew: 404 },
	'/office/care/visits/[id]?/part': { anonymous: 303, owner: 404, sales: 404, crew: 404 },
	'/office/care/visits/[id]?/removePart': { anonymous: 303, owner: 404, sales: 404, crew: 404 },
	'/office/care/visits/[id]?/photo': { anonymous: 303, owner: 404, sales: 404, crew: 404 },
	'/office/care/visits/[id]?/done': { anonymous: 303, owner: 404, sales: 404, crew: 404 },
	'/office/account/calendar?/reset': { anonymous: 303, owner: 200, sales: 200, crew: 200 },
	// The empty public sign-up is refused beside its fields; the price preview answers anyone.
	'/care?/signUp': { anonymous: 400, owner: 400, sales: 400, crew: 400 },
	'/care?/price': { anonymous: 200, owner: 200, sales: 200, crew: 200 },
	'/care/[token]?/signUp': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/care/[token]?/pay': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/care/[token]?/cancel': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/care/visit/[token]?/another': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/care/visit/[token]?/pay': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/office/team?/invite': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/team?/role': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/team?/disable': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/team?/enable': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/settings': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/payments/[jobId]?/record': { anonymous: 303, owner: 404, sales: 403, crew: 403 },
	'/office/payments/[jobId]?/refund': { anonymous: 303, owner: 404, sales: 403, crew: 403 },
	'/office/payments/[jobId]?/invoice': { anonymous: 303, owner: 404, sales: 403, crew: 403 },
	'/office/payments/[jobId]?/link': { anonymous: 303, owner: 404, sales: 403, crew: 403 },
	'/pay/[token]': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/office/price-list?/item': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/price-list?/remove': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/price-list?/pump': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/price-list?/labor': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/price-list?/settings': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/price-list?/yard': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/price-list/import?/preview': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/price-list/import?/commit': { anonymous: 303, owner: 400, sales: 403, crew: 403 },
	'/office/leads/[id]/estimate?/create': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/leads/[id]/estimate?/send': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/leads/[id]/estimate?/newVersion': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	// The empty form is refused (400), then the page re-renders and its load 404s on the token.
	'/estimate/[token]?/accept': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/estimate/[token]?/decline': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	'/estimate/[token]?/question': { anonymous: 404, owner: 404, sales: 404, crew: 404 },
	// The action refuses the empty form (400), then the page of an unknown lead renders as 404.
	'/office/leads/[id]?/stage': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/leads/[id]?/assign': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/leads/[id]?/priority': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/leads/[id]?/details': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/leads/[id]?/log': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/leads/[id]?/mail': { anonymous: 303, owner: 404, sales: 404, crew: 403 },
	'/office/leads/[id]?/merge': { anonymous: 303, owner: 404, sales: 404, crew: 403 }
};

const guardedPatterns = [
	...new Set(
		routeFiles(resolve('src/routes'))
			.filter(
				(r) =>
					/^\/(office|api|estimate|visit|change-order|pay|invoice|care|calendar)(\/|$)/.test(
						r.pattern
					) && r.kind !== 'layout-server'
			)
			.map((r) => r.pattern)
	)
];

test('every guarded route in the tree has expected statuses', () => {
	const missing = guardedPatterns.filter((p) => !PAGES[p]);
	expect(missing, 'add these routes to PAGES in route-matrix.spec.ts').toEqual([]);
});

const contexts = new Map<Who, APIRequestContext>();
test.beforeAll(async ({ baseURL }) => {
	for (const who of ['anonymous', 'owner', 'sales', 'crew'] as const) {
		contexts.set(who, await apiAs(baseURL!, who === 'anonymous' ? null : who));
	}
});
test.afterAll(async () => {
	for (const ctx of contexts.values()) await ctx.dispose();
});

for (const [path, expected] of Object.entries(PAGES)) {
	test(`GET ${path}`, async () => {
		for (const [who, status] of Object.entries(expected) as [Who, number][]) {
			const anonApi =
				who === 'anonymous' && path.startsWith('/api') && status !== 200 && status !== 405;
			const res = await contexts.get(who)!.get(path, { maxRedirects: 0 });
			expect(res.status(), `${who} on ${path}`).toBe(anonApi ? 401 : status);
			if (status === 303) expect(res.headers().location).toMatch(/^\/sign-in\?next=/);
		}
	});
}

for (const [path, expected] of Object.entries(ACTIONS)) {
	test(`POST ${path}`, async () => {
		for (const [who, status] of Object.entries(expected) as [Who, number][]) {
			const res = await contexts.get(who)!.post(path, { form: {}, maxRedirects: 0 });
			expect(res.status(), `${who} posting ${path}`).toBe(status);
		}
	});
}
