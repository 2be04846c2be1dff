// A local stand-in for the hosted payment provider: just what Rillstone uses of its API
// (create and read a checkout session), a payment page where a person or a test can pay,
// have the card declined, or give up, and signed webhook events sent back to the app with
// the provider SDK's own signing scheme, retried while the app does not answer.
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import { randomBytes } from 'node:crypto';
import Stripe from 'stripe';

export interface PayStandInOptions {
	port: number;
	apiKey: string;
	webhookSecret: string;
	webhookUrl: string;
	/** Delays between webhook attempts, in ms (real providers retry for days; this is bounded). */
	retryDelaysMs?: number[];
}

interface Session {
	id: string;
	object: 'checkout.session';
	mode: string;
	status: 'open' | 'complete' | 'expired';
	payment_status: 'unpaid' | 'paid';
	amount_total: number;
	currency: string;
	client_reference_id: string | null;
	customer_email: string | null;
	metadata: Record<string, string>;
	success_url: string;
	cancel_url: string;
	url: string;
	payment_intent: string | null;
	created: number;
	description: string;
	declines: number;
}

export interface Delivery {
	eventId: string;
	type: string;
	attempts: number;
	delivered: boolean;
	lastStatus: number | null;
}

const id = (prefix: string) => `${prefix}_test_${randomBytes(12).toString('hex')}`;
const signer = new Stripe('sk_test_signer_only');

function readBody(req: IncomingMessage): Promise<string> {
	return new Promise((resolve, reject) => {
		let body = '';
		req.setEncoding('utf8');
		req.on('data', (chunk) => (body += chunk));
		req.on('end', () => resolve(body));
		req.on('error', reject);
	});
}

function send(res: ServerResponse, status: number, body: unknown) {
	res.writeHead(status, { 'content-type': 'application/json' });
	res.end(JSON.stringify(body));
}

function html(res: ServerResponse, status: number, body: string) {
	res.writeHead(status, { 'content-type': 'text/html; charset=utf-8' });
	res.end(`<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1"><title>Test payment</title>
<style>body{font-family:system-ui,sans-serif;max-width:28rem;margin:3rem auto;padding:0 1rem;color:#222}button{font-size:1rem;padding:.6rem 1rem;margin:.3rem .3rem .3rem 0;border-radius:6px;border:1px solid #555;background:#fff;cursor:pointer}button.pay{background:#1b5356;color:#fff;border-color:#1b5356}.bad{color:#a1261d}</style></head><body>${body}</body></html>`);
}

const money = (cents: number, currency: string) =>
	new Intl.NumberFormat('en-US', { style: 'currency', currency: currency.toUpperCase() }).format(
		cents / 100
	);

export async function startPayStandIn(opts: PayStandInOptions) {
	const sessions = new Map<string, Session>();
	const deliveries: Delivery[] = [];
	const events = new Map<string, string>();
	const delays = opts.retryDelaysMs ?? [500, 1000, 2000, 4000, 8000, 15000, 30000];
	let closed = false;

	/** The session as the provider's API shows it (without the stand-in's own bookkeeping). */
	function publicSession(s: Session): Omit<Session, 'declines' | 'description'> {
		const copy: Partial<Session> = { ...s };
		delete copy.declines;
		delete copy.description;
		return copy as Omit<Session, 'declines' | 'description'>;
	}

	async function deliver(eventId: string, delivery: Delivery) {
		const payload = events.get(eventId)!;
		for (let attempt = 0; attempt <= delays.length && !closed; attempt++) {
			delivery.attempts++;
			try {
				const header = signer.webhooks.generateTestHeaderString({
					payload,
					secret: opts.webhookSecret
				});
				const res = await fetch(opts.webhookUrl, {
					method: 'POST',
					headers: { 'content-type': 'application/json', 'stripe-signature': header },
					body: payload,
					signal: AbortSignal.timeout(10_000)
				});
				delivery.lastStatus = res.status;
				if (res.ok) {
					delivery.delivered = true;
					return;
				}
			} catch {
				delivery.lastStatus = null;
			}
			if (attempt < delays.length) await new Promise((r) => setTimeout(r, delays[attempt]));
		}
	}

	function emit(type: string, session: Session) {
		const eventId = id('evt');
		const object = publicSession(session);
		events.set(
			eventId,
			JSON.stringify({
				id: eventId,
				object: 'event',
				type,
				created: Math.floor(Date.now() / 1000),
				livemode: false,
				data: { object }
			})
		);
		const delivery: Delivery = { eventId, type, attempts: 0, delivered: false, lastStatus: null };
		deliveries.push(delivery);
		void deliver(eventId, delivery);
		return eventId;
	}

	async function createSession(req: IncomingMessage, res: ServerResponse) {
		const form = new URLSearchParams(await readBody(req));
		const currency = form.get('line_items[0][price_data][currency]') ?? 'usd';
		let amount = 0;
		for (let i = 0; form.has(`line_items[${i}][price_data][unit_amount]`); i++) {
			amount +=
				Number(form.get(`line_items[${i}][price_data][unit_amount]`)) *
				Number(form.get(`line_items[${i}][quantity]`) ?? 1);
		}
		if (!Number.isInteger(amount) || amount <= 0) {
			return send(res, 400, {
				error: { type: 'invalid_request_error', message: 'line_items need a positive unit_amount' }
			});
		}
		const successUrl = form.get('success_url');
		const cancelUrl = form.get('cancel_url');
		if (!successUrl || !cancelUrl) {
			return send(res, 400, {
				error: { type: 'invalid_request_error', message: 'success_url and cancel_url are required' }
			});
		}
		const metadata: Record<string, string> = {};
		for (const [key, value] of form) {
			const m = /^metadata\[(.+)\]$/.exec(key);
			if (m) metadata[m[1]] = value;
		}
		const sessionId = id('cs');
		const session: Session = {
			id: sessionId,
			object: 'checkout.session',
			mode: form.get('mode') ?? 'payment',
			status: 'open',
			payment_status: 'unpaid',
			amount_total: amount,
			currency,
			client_reference_id: form.get('client_reference_id'),
			customer_email: form.get('customer_email'),
			metadata,
			success_url: successUrl,
			cancel_url: cancelUrl,
			url: `http://127.0.0.1:${opts.port}/pay/${sessionId}`,
			payment_intent: null,
			created: Math.floor(Date.now() / 1000),
			description: form.get('line_items[0][price_data][product_data][name]') ?? 'Payment',
			declines: 0
		};
		sessions.set(sessionId, session);
		send(res, 200, publicSession(session));
	}

	function payPage(res: ServerResponse, s: Session, note = '') {
		if (s.status !== 'open') return html(res, 410, `<h1>This checkout is ${s.status}</h1>`);
		html(
			res,
			200,
			`<p>Local test payment page (no real money moves)</p><h1>${s.description.replace(/[<>&]/g, '')}</h1><p><strong>${money(s.amount_total, s.currency)}</strong></p>${note}
<form method="post" action="/pay/${s.id}/succeed"><button class="pay" type="submit">Pay ${money(s.amount_total, s.currency)}</button></form>
<form method="post" action="/pay/${s.id}/decline"><button type="submit">Use a card that is declined</button></form>
<form method="post" action="/pay/${s.id}/abandon"><button type="submit">Go back without paying</button></form>`
		);
	}

	const server: Server = createServer(async (req, res) => {
		const url = new URL(req.url ?? '/', `http://127.0.0.1:${opts.port}`);
		const parts = url.pathname.split('/').filter(Boolean);
		try {
			if (parts[0] === 'v1') {
				if (req.headers.authorization !== `Bearer ${opts.apiKey}`) {
					return send(res, 401, {
						error: { type: 'invalid_request_error', message: 'Invalid API Key provided' }
					});
				}
				if (req.method === 'POST' && url.pathname === '/v1/checkout/sessions') {
					return await createSession(req, res);
				}
				if (
					req.method === 'GET' &&
					parts[1] === 'checkout' &&
					parts[2] === 'sessions' &&
					parts[3]
				) {
					const s = sessions.get(parts[3]);
					return s
						? send(res, 200, publicSession(s))
						: send(res, 404, {
								error: {
									type: 'invalid_request_error',
									message: `No such checkout.session: '${parts[3]}'`
								}
							});
				}
				return send(res, 404, {
					error: { type: 'invalid_request_error', message: 'Unrecognized request URL' }
				});
			}
			if (parts[0] === 'pay' && parts[1]) {
				const s = sessions.get(parts[1]);
				if (!s) return html(res, 404, '<h1>No such checkout</h1>');
				if (req.method === 'GET') return payPage(res, s);
				await readBody(req);
				if (s.status !== 'open') return html(res, 410, `<h1>This checkout is ${s.status}</h1>`);
				if (parts[2] === 'succeed') {
					s.status = 'complete';
					s.payment_status = 'paid';
					s.payment_intent = id('pi');
					emit('checkout.session.completed', s);
					res.writeHead(303, { location: s.success_url.replace('{CHECKOUT_SESSION_ID}', s.id) });
					return res.end();
				}
				if (parts[2] === 'decline') {
					s.declines++;
					return payPage(
						res,
						s,
						'<p class="bad" role="alert">Your card was declined. Try another card.</p>'
					);
				}
				if (parts[2] === 'abandon') {
					res.writeHead(303, { location: s.cancel_url.replace('{CHECKOUT_SESSION_ID}', s.id) });
					return res.end();
				}
			}
			if (parts[0] === '_standin') {
				// Test controls: list deliveries, expire a session, send an event again.
				if (parts[1] === 'deliveries') return send(res, 200, deliveries);
				if (parts[1] === 'expire' && parts[2] && req.method === 'POST') {
					const s = sessions.get(parts[2]);
					if (!s || s.status !== 'open') return send(res, 409, { error: 'not open' });
					s.status = 'expired';
					return send(res, 200, { eventId: emit('checkout.session.expired', s) });
				}
				if (parts[1] === 'redeliver' && parts[2] && req.method === 'POST') {
					if (!events.has(parts[2])) return send(res, 404, { error: 'no such event' });
					const delivery: Delivery = {
						eventId: parts[2],
						type: 'redelivery',
						attempts: 0,
						delivered: false,
						lastStatus: null
					};
					deliveries.push(delivery);
					await deliver(parts[2], delivery);
					return send(res, 200, delivery);
				}
			}
			send(res, 404, { error: 'not found' });
		} catch (error) {
			send(res, 500, { error: { message: (error as Error).message } });
		}
	});
	await new Promise<void>((resolve, reject) => {
		server.once('error', reject);
		server.listen(opts.port, '127.0.0.1', () => resolve());
	});
	return {
		name: 'payments',
		deliveries,
		stop: () =>
			new Promise<void>((resolve) => {
				closed = true;
				server.closeAllConnections();
				server.close(() => resolve());
			})
	};
}
