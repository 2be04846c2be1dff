// The payment stand-in speaks the provider's API to its official SDK, and its webhooks verify
// with the SDK's own signature check: the same code would run against the real provider.
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import { startPayStandIn } from '../../scripts/lib/pay-standin';

/** A port the OS has just handed out, so two test runs on one machine never collide. */
function freePort(): Promise<number> {
	return new Promise((resolve, reject) => {
		const probe = createServer();
		probe.once('error', reject);
		probe.listen(0, '127.0.0.1', () => {
			const { port } = probe.address() as AddressInfo;
			probe.close(() => resolve(port));
		});
	});
}

const PAY_PORT = await freePort();
const HOOK_PORT = await freePort();
const SECRET = 'whsec_test_standin';
let standIn: Awaited<ReturnType<typeof startPayStandIn>>;
const received: { body: string; signature: string }[] = [];
let hookServer: Server | null = null;
let hookStatus = 200;

function startHook(): Promise<void> {
	hookServer = createServer((req, res) => {
		let body = '';
		req.on('data', (c) => (body += c));
		req.on('end', () => {
			received.push({ body, signature: String(req.headers['stripe-signature'] ?? '') });
			res.writeHead(hookStatus).end();
		});
	});
	return new Promise((resolve) => hookServer!.listen(HOOK_PORT, '127.0.0.1', () => resolve()));
}

const sdk = new Stripe('sk_test_standin', {
	host: '127.0.0.1',
	port: PAY_PORT,
	protocol: 'http',
	maxNetworkRetries: 0
});

beforeAll(async () => {
	standIn = await startPayStandIn({
		port: PAY_PORT,
		apiKey: 'sk_test_standin',
		webhookSecret: SECRET,
		webhookUrl: `http://127.0.0.1:${HOOK_PORT}/hook`,
		retryDelaysMs: [200, 200, 400, 800]
	});
});
afterAll(async () => {
	await standIn.stop();
	hookServer?.close();
});

async function newSession(amount = 125_000) {
	return sdk.checkout.sessions.create({
		mode: 'payment',
		client_reference_id: 'job-1',
		success_url: 'http://127.0.0.1:1/receipt?session={CHECKOUT_SESSION_ID}',
		cancel_url: 'http://127.0.0.1:1/cancelled',
		metadata: { kind: 'deposit' },
		line_items: [
			{
				quantity: 1,
				price_data: { currency: 'usd', unit_amount: amount, product_data: { name: 'Deposit' } }
			}
		]
	});
}

async function waitFor<T>(read: () => T | undefined, timeoutMs = 5000): Promise<T> {
	const deadline = Date.now() + timeoutMs;
	while (Date.now() < deadline) {
		const value = read();
		if (value !== undefined) return value;
		await new Promise((r) => setTimeout(r, 50));
	}
	throw new Error('timed out');
}

describe('payment stand-in', () => {
	it('creates and reads a checkout session through the SDK', async () => {
		const session = await newSession();
		expect(session.id).toMatch(/^cs_test_/);
		expect(session.amount_total).toBe(125_000);
		expect(session.url).toBe(`http://127.0.0.1:${PAY_PORT}/pay/${session.id}`);
		const again = await sdk.checkout.sessions.retrieve(session.id);
		expect(again.status).toBe('open');
		expect(again.metadata).toEqual({ kind: 'deposit' });
	});

	it('refuses a wrong API key, as the provider does', async () => {
		const wrong = new Stripe('sk_test_wrong', {
			host: '127.0.0.1',
			port: PAY_PORT,
			protocol: 'http',
			maxNetworkRetries: 0
		});
		await expect(wrong.checkout.sessions.retrieve('cs_test_x')).rejects.toThrow(/Invalid API Key/);
	});

	it('a declined card completes nothing; paying sends a webhook the SDK verifies', async () => {
		await startHook();
		const session = await newSession(5_000);
		const declined = await fetch(`http://127.0.0.1:${PAY_PORT}/pay/${session.id}/decline`, {
			method: 'POST'
		});
		expect(await declined.text()).toContain('declined');
		expect((await sdk.checkout.sessions.retrieve(session.id)).status).toBe('open');

		const paid = await fetch(`http://127.0.0.1:${PAY_PORT}/pay/${session.id}/succeed`, {
			method: 'POST',
			redirect: 'manual'
		});
		expect(paid.status).toBe(303);
		expect(paid.headers.get('location')).toBe(`http://127.0.0.1:1/receipt?session=${session.id}`);
		const hook = await waitFor(() => received.find((r) => r.body.includes(session.id)));
		const event = sdk.webhooks.constructEvent(hook.body, hook.signature, SECRET);
		expect(event.type).toBe('checkout.session.completed');
		expect((event.data.object as Stripe.Checkout.Session).amount_total).toBe(5_000);
		expect(() => sdk.webhooks.constructEvent(hook.body, hook.signature, 'whsec_other')).toThrow();
		expect(() =>
			sdk.webhooks.constructEvent(hook.body.replace('5000', '500'), hook.signature, SECRET)
		).toThrow();
	});

	it('keeps retrying a webhook while the app is down, and delivers it when it is back', async () => {
		hookStatus = 200;
		hookServer?.close();
		hookServer = null;
		const session = await newSession(7_700);
		await fetch(`http://127.0.0.1:${PAY_PORT}/pay/${session.id}/succeed`, {
			method: 'POST',
			redirect: 'manual'
		});
		const delivery = () =>
			standIn.deliveries.find(
				(d) => d.type === 'checkout.session.completed' && !d.delivered && d.attempts >= 2
			);
		await waitFor(delivery);
		await startHook();
		await waitFor(() => received.find((r) => r.body.includes(session.id)), 8000);
		expect(standIn.deliveries.some((d) => d.delivered && d.attempts >= 2)).toBe(true);
	});
});
