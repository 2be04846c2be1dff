// The hosted payment provider through its official SDK. Locally the SDK is pointed at the
// stand-in (host, port, protocol from the environment); with real keys and no overrides it
// talks to the provider itself, with no code change.
import Stripe from 'stripe';
import { env, requireSecret } from '../platform/env';

let client: Stripe | null = null;

export function paymentsClient(): Stripe {
	client ??= new Stripe(requireSecret('PAYMENTS_SECRET_KEY'), {
		host: env.PAYMENTS_API_HOST,
		port: env.PAYMENTS_API_PORT ? Number(env.PAYMENTS_API_PORT) : undefined,
		protocol: (env.PAYMENTS_API_PROTOCOL as 'http' | 'https' | undefined) ?? undefined,
		maxNetworkRetries: 2,
		timeout: 10_000
	});
	return client;
}

export function webhookSecret(): string {
	return requireSecret('PAYMENTS_WEBHOOK_SECRET');
}

export interface CheckoutRequest {
	amountCents: number;
	currency: string;
	description: string;
	reference: string;
	email?: string;
	successUrl: string;
	cancelUrl: string;
	metadata: Record<string, string>;
}

export async function createCheckout(request: CheckoutRequest) {
	const session = await paymentsClient().checkout.sessions.create({
		mode: 'payment',
		client_reference_id: request.reference,
		customer_email: request.email,
		success_url: request.successUrl,
		cancel_url: request.cancelUrl,
		metadata: request.metadata,
		line_items: [
			{
				quantity: 1,
				price_data: {
					currency: request.currency,
					unit_amount: request.amountCents,
					product_data: { name: request.description }
				}
			}
		]
	});
	return { id: session.id, url: session.url! };
}

/** Verifies a webhook with the SDK; throws when the signature is missing, wrong or stale. */
export function verifyWebhook(rawBody: string, signature: string | null): Stripe.Event {
	if (!signature) throw new Error('missing signature');
	return paymentsClient().webhooks.constructEvent(rawBody, signature, webhookSecret());
}
