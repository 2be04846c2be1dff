// Invented demo inquiries for the Copperleaf scenario: twelve leads across the stages and the
// towns around Linden Ford, with contacts, properties, timeline entries and a few yard photos
// drawn as SVG and rendered with sharp (never taken from elsewhere). Demo only; safe to run twice.
import { eq } from 'drizzle-orm';
import sharp from 'sharp';
import { S3Client, PutObjectCommand } from '@aws-sdk/client-s3';
import { randomBytes } from 'node:crypto';
import {
	activities,
	contacts,
	leads,
	photos,
	properties,
	users,
	type LeadStage
} from '../../src/lib/server/platform/db/schema';
import { newId } from '../../src/lib/server/platform/crypto';
import { scriptDb } from '../lib/db';
import { inquiryActivity } from './shared';

interface DemoLead {
	name: string;
	email: string;
	phone: string;
	street: string;
	town: string;
	stage: LeadStage;
	services: string[];
	budget: string;
	timeframe: string;
	message: string;
	daysAgo: number;
	ref?: string;
	photos?: ('slope' | 'patio')[];
	close?: 'budget' | 'timing' | 'not_a_fit';
}

const DEMO: DemoLead[] = [
	{
		name: 'Juniper Okafor',
		email: 'juniper.okafor@example.test',
		phone: '(555) 010-2231',
		street: '4 Fernbrake Row',
		town: 'Alder Flats',
		stage: 'new',
		services: ['water-feature', 'lighting'],
		budget: '5k-15k',
		timeframe: 'this-season',
		message:
			'A bubbling stone we can see from the kitchen window, with a light for winter evenings.',
		daysAgo: 0,
		ref: 'granite-boulder-trio',
		photos: ['patio', 'slope']
	},
	{
		name: 'Wren Haldane',
		email: 'wren.haldane@example.test',
		phone: '',
		street: '9 Quarry Lane',
		town: 'Cinder Bluff',
		stage: 'new',
		services: ['pond', 'planting'],
		budget: 'unsure',
		timeframe: 'next-season',
		message: 'A small pond the birds can use, near the old apple tree.',
		daysAgo: 1,
		photos: ['slope']
	},
	{
		name: 'Tobias Fenwright',
		email: 'tobias.fenwright@example.test',
		phone: '(555) 010-8812',
		street: '112 Sable Ridge Road',
		town: 'Sable Ridge',
		stage: 'new',
		services: ['stream'],
		budget: '15k-30k',
		timeframe: 'soon',
		message: 'Our back yard drops about six feet to the fence. Could a stream run down it?',
		daysAgo: 1,
		ref: 'hillside-pondless-stream'
	},
	{
		name: 'Priya Castellane',
		email: 'priya.castellane@example.test',
		phone: '(555) 010-3390',
		street: '38 Wren Crossing',
		town: 'Wren Crossing',
		stage: 'contacted',
		services: ['patio', 'walls'],
		budget: '15k-30k',
		timeframe: 'this-season',
		message: 'Flagstone patio with a seat wall, maybe lights in the cap.',
		daysAgo: 3,
		ref: 'lit-terrace-seat-wall'
	},
	{
		name: 'Oren Blackwood',
		email: 'oren.blackwood@example.test',
		phone: '(555) 010-4478',
		street: '7 Millpond Court',
		town: 'Linden Ford',
		stage: 'contacted',
		services: ['water-feature'],
		budget: '5k-15k',
		timeframe: 'next-season',
		message: 'Wall-mounted spout in the courtyard, something quiet.',
		daysAgo: 5,
		ref: 'courtyard-wall-spout'
	},
	{
		name: 'Marisol Quenby',
		email: 'marisol.quenby@example.test',
		phone: '(555) 010-6120',
		street: '21 Harrow Creek Drive',
		town: 'Harrow Creek',
		stage: 'visit_booked',
		services: ['pond', 'lighting'],
		budget: '15k-30k',
		timeframe: 'this-season',
		message:
			'Wildlife pond with a shallow beach for the grandchildren to look at frogs (fenced, please).',
		daysAgo: 6,
		ref: 'wildlife-pond',
		photos: ['patio']
	},
	{
		name: 'Declan Ashgrove',
		email: 'declan.ashgrove@example.test',
		phone: '(555) 010-7004',
		street: '3 Marten Springs Lane',
		town: 'Marten Springs',
		stage: 'visit_booked',
		services: ['water-feature', 'planting'],
		budget: '5k-15k',
		timeframe: 'soon',
		message: 'Three drilled boulders by the front walk.',
		daysAgo: 8
	},
	{
		name: 'Ingrid Thornbury',
		email: 'ingrid.thornbury@example.test',
		phone: '(555) 010-5561',
		street: '60 Quarry Hollow Road',
		town: 'Quarry Hollow',
		stage: 'estimating',
		services: ['stream', 'walls'],
		budget: '30k-plus',
		timeframe: 'next-season',
		message: 'A stream and a low retaining wall along the drive.',
		daysAgo: 12
	},
	{
		name: 'Felix Marchbank',
		email: 'felix.marchbank@example.test',
		phone: '(555) 010-9023',
		street: '15 Linden Ford Avenue',
		town: 'Linden Ford',
		stage: 'estimate_sent',
		services: ['water-feature', 'lighting'],
		budget: '5k-15k',
		timeframe: 'this-season',
		message: 'Slate spillway into a pebble basin by the deck.',
		daysAgo: 18,
		ref: 'slate-spillway'
	},
	{
		name: 'Odette Ravensworth',
		email: 'odette.ravensworth@example.test',
		phone: '(555) 010-1187',
		street: '2 Alder Flats Way',
		town: 'Alder Flats',
		stage: 'sold',
		services: ['patio'],
		budget: '5k-15k',
		timeframe: 'this-season',
		message: 'Flagstone path from the gate to the garden shed.',
		daysAgo: 30,
		ref: 'flagstone-garden-path'
	},
	{
		name: 'Cyrus Pembleton',
		email: 'cyrus.pembleton@example.test',
		phone: '(555) 010-2764',
		street: '48 Cinder Bluff Road',
		town: 'Cinder Bluff',
		stage: 'closed',
		services: ['pond'],
		budget: 'under-5k',
		timeframe: 'soon',
		message: 'A koi pond, about 20 by 30 feet.',
		daysAgo: 40,
		close: 'budget'
	},
	{
		name: 'Annika Holloway',
		email: 'annika.holloway@example.test',
		phone: '(555) 010-3318',
		street: '5 Heron Bend',
		town: 'Harrow Creek',
		stage: 'closed',
		services: ['other'],
		budget: 'unsure',
		timeframe: 'next-year',
		message: 'Snow removal for the winter.',
		daysAgo: 45,
		close: 'not_a_fit'
	}
];

/** A drawn yard: lawn, a fence, a slope or a patio edge. Invented, rendered here. */
function yardSvg(kind: 'slope' | 'patio'): string {
	const ground =
		kind === 'slope'
			? '<path d="M0 520 L1600 300 L1600 1200 L0 1200 Z" fill="#6f8f43"/><path d="M0 600 L1600 380" stroke="#5a7537" stroke-width="8"/>'
			: '<rect y="560" width="1600" height="640" fill="#6f8f43"/><rect y="860" width="900" height="340" fill="#b9a88e"/><path d="M0 860 H900 V1200" stroke="#8d7d66" stroke-width="10" fill="none"/>';
	return `<svg xmlns="http://www.w3.org/2000/svg" width="1600" height="1200"><rect width="1600" height="1200" fill="#a9cde3"/>${ground}<g fill="#8a6a45">${Array.from({ length: 16 }, (_, i) => `<rect x="${i * 100 + 20}" y="380" width="60" height="200"/>`).join('')}</g><ellipse cx="1150" cy="760" rx="140" ry="70" fill="#7d7d78"/></svg>`;
}

async function putPhoto(s3: S3Client, bucket: string, kind: 'slope' | 'patio') {
	const base = sharp(Buffer.from(yardSvg(kind)));
	const display = await base
		.clone()
		.resize(2048, 2048, { fit: 'inside', withoutEnlargement: true })
		.webp({ quality: 80 })
		.toBuffer({ resolveWithObject: true });
	const thumb = await base
		.clone()
		.resize(480, 480, { fit: 'inside' })
		.webp({ quality: 72 })
		.toBuffer();
	const id = randomBytes(16).toString('hex');
	const displayKey = `intake/${id}/display.webp`;
	const thumbKey = `intake/${randomBytes(16).toString('hex')}/thumb.webp`;
	for (const [Key, Body] of [
		[displayKey, display.data],
		[thumbKey, thumb]
	] as const) {
		await s3.send(new PutObjectCommand({ Bucket: bucket, Key, Body, ContentType: 'image/webp' }));
	}
	return {
		displayKey,
		thumbKey,
		width: display.info.width,
		height: display.info.height,
		bytes: display.data.length
	};
}

export interface SeedLeadsOptions {
	s3?: { endpoint: string; bucket: string };
}

/** Writes the demo leads once (skipped when the first demo contact already exists). */
export async function seedLeads(url: string, options: SeedLeadsOptions = {}): Promise<void> {
	const { db, close } = scriptDb(url);
	try {
		const [exists] = await db
			.select()
			.from(contacts)
			.where(eq(contacts.email, DEMO[0].email))
			.limit(1);
		if (exists) return;
		const staff = await db.select().from(users);
		const sales = staff.find((u) => u.role === 'sales');
		const s3 = options.s3
			? new S3Client({
					endpoint: options.s3.endpoint,
					region: 'us-east-1',
					credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
					forcePathStyle: true,
					requestChecksumCalculation: 'WHEN_REQUIRED',
					responseChecksumValidation: 'WHEN_REQUIRED'
				})
			: null;
		for (const d of DEMO) {
			const at = new Date(Date.now() - d.daysAgo * 86_400_000 - 3 * 3_600_000);
			const contactId = newId();
			const digits = d.phone.replace(/\D/g, '');
			await db.insert(contacts).values({
				id: contactId,
				name: d.name,
				email: d.email,
				phone: d.phone || null,
				phoneDigits: digits || null,
				isCustomer: d.stage === 'sold',
				createdAt: at
			});
			const propertyId = newId();
			await db
				.insert(properties)
				.values({ id: propertyId, contactId, street: d.street, town: d.town, createdAt: at });
			const leadId = newId();
			const touched = d.stage !== 'new';
			await db.insert(leads).values({
				id: leadId,
				contactId,
				propertyId,
				stage: d.stage,
				services: d.services,
				budget: d.budget,
				timeframe: d.timeframe,
				message: d.message,
				source: 'website',
				referenceProject: d.ref ?? null,
				assigneeId: touched ? (sales?.id ?? null) : null,
				firstReplyAt: touched ? new Date(at.getTime() + 5 * 3_600_000) : null,
				lastTouchAt: touched ? new Date(at.getTime() + 5 * 3_600_000) : at,
				closeReason: d.close ?? null,
				consentAt: at,
				createdAt: at,
				updatedAt: at
			});
			await db
				.insert(activities)
				.values(
					inquiryActivity(leadId, d, at, { photos: d.photos?.length ?? 0, ref: d.ref ?? null })
				);
			if (touched) {
				await db.insert(activities).values({
					leadId,
					kind: 'call',
					actorId: sales?.id ?? null,
					body: 'Called back; talked through the spot and the budget.',
					createdAt: new Date(at.getTime() + 5 * 3_600_000)
				});
			}
			for (const kind of d.photos ?? []) {
				if (!s3 || !options.s3) break;
				try {
					const p = await putPhoto(s3, options.s3.bucket, kind);
					await db.insert(photos).values({
						id: newId(),
						leadId,
						context: 'intake',
						originalName: `${kind === 'slope' ? 'back-slope' : 'patio-edge'}.jpg`,
						...p,
						createdAt: at
					});
				} catch (error) {
					console.warn(`[seed] demo photo skipped (S3 out of reach): ${(error as Error).message}`);
				}
			}
		}
	} finally {
		await close();
	}
}
