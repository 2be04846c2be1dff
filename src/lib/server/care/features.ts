// Features on record for a property: added automatically from a job the firm completes, or
// by hand for work another firm built. Care plans price them and service visits attach to them.
// A property's place for routing is a pin staff set, or the centre of its US postal code from
// the zipcodes package's own data file (nothing is asked of an online map or geocoder).
import { upgradeDesign } from '$lib/estimating/upgrade';
import { and, asc, eq, ilike, or, sql } from 'drizzle-orm';
import { db } from '../platform/db';
import {
	contacts,
	properties,
	propertyFeatures,
	propertyLocations,
	type Job,
	type PropertyFeature
} from '../platform/db/schema';
import { newId } from '../platform/crypto';
import type { FeatureKind, FeatureSize } from '$lib/care/kinds';
import { CareError, type Db, type Tx } from './db';

export interface FeatureInput {
	kind: FeatureKind;
	size: FeatureSize;
	pump: string;
	lights: number;
	notes: string;
	builtBy: 'us' | 'others';
}

export async function propertyRecord(propertyId: string, tx: Db = db) {
	const [row] = await tx
		.select({ property: properties, contact: contacts })
		.from(properties)
		.innerJoin(contacts, eq(contacts.id, properties.contactId))
		.where(eq(properties.id, propertyId));
	if (!row) throw new CareError('not_found', 'There is no such property.');
	return row;
}

export function addressOf(p: { street: string; town: string; postalCode: string }): string {
	return [p.street, p.town, p.postalCode].filter(Boolean).join(', ');
}

export async function featuresOf(propertyId: string, tx: Db = db): Promise<PropertyFeature[]> {
	return tx
		.select()
		.from(propertyFeatures)
		.where(eq(propertyFeatures.propertyId, propertyId))
		.orderBy(asc(propertyFeatures.createdAt));
}

export async function addFeature(propertyId: string, input: FeatureInput, userId: string | null) {
	await propertyRecord(propertyId);
	const [row] = await db
		.insert(propertyFeatures)
		.values({ id: newId(), propertyId, ...input, createdBy: userId })
		.returning();
	return row;
}

export async function updateFeature(propertyId: string, featureId: string, input: FeatureInput) {
	const rows = await db
		.update(propertyFeatures)
		.set(input)
		.where(and(eq(propertyFeatures.id, featureId), eq(propertyFeatures.propertyId, propertyId)))
		.returning({ id: propertyFeatures.id });
	if (!rows.length) throw new CareError('not_found', 'There is no such feature at this property.');
}

export async function removeFeature(propertyId: string, featureId: string) {
	await db
		.delete(propertyFeatures)
		.where(and(eq(propertyFeatures.id, featureId), eq(propertyFeatures.propertyId, propertyId)));
}

const sizeBy = (n: number, small: number, medium: number): FeatureSize =>
	n <= small ? 'small' : n <= medium ? 'medium' : 'large';

type DesignFeature = {
	kind?: string;
	outlets?: unknown[];
	basin?: unknown;
	zones?: unknown[];
	segments?: { fallHeightIn?: number }[];
	pumpModelId?: string;
};

/** A water feature's size for the care price: by outlets, depth zones or falls (common practice, no source). */
function waterFeatureSize(f: DesignFeature): FeatureSize {
	if (f.kind === 'pond') return sizeBy(f.zones?.length ?? 1, 1, 2);
	if (f.kind === 'stream') {
		return sizeBy((f.segments ?? []).filter((s) => (s.fallHeightIn ?? 0) > 0).length, 1, 3);
	}
	return sizeBy(f.outlets?.length ?? 0, 1, 3);
}

/** The water features of a design of either stored shape (fountain, pond, stream). */
export function waterFeaturesOf(design: unknown): DesignFeature[] {
	const current = upgradeDesign(design) as { features?: DesignFeature[] };
	return (current.features ?? []).filter(
		(f) =>
			(f.kind === 'fountain' && ((f.outlets?.length ?? 0) > 0 || f.basin)) ||
			f.kind === 'pond' ||
			f.kind === 'stream'
	);
}

/**
 * The features a completed job puts on record, read from what was sold: each water feature
 * (fountain, pond, stream, with its pump) and the lighting (its fixtures). Sizes follow the
 * count of outlets, depth zones, falls or fixtures (common practice, no source); staff can
 * correct them.
 */
export function featuresFromDesign(
	design: Record<string, unknown>,
	pumpNames: Map<string, string> = new Map()
) {
	const out: (FeatureInput & { notes: string })[] = [];
	for (const f of waterFeaturesOf(design)) {
		out.push({
			kind: f.kind as FeatureInput['kind'],
			size: waterFeatureSize(f),
			pump: (f.pumpModelId && pumpNames.get(f.pumpModelId)) || '',
			lights: 0,
			notes: '',
			builtBy: 'us'
		});
	}
	const lighting = design.lighting as
		{ fixtures?: unknown[]; runs?: { fixtures?: unknown[] }[] } | undefined;
	// The fixtures list is the design's own; runs only point at them.
	const fixtures = Array.isArray(lighting?.fixtures)
		? lighting.fixtures.length
		: (lighting?.runs ?? []).reduce(
				(n, r) => n + (Array.isArray(r.fixtures) ? r.fixtures.length : 0),
				0
			);
	if (lighting && fixtures > 0) {
		out.push({
			kind: 'lighting',
			size: sizeBy(fixtures, 4, 10),
			pump: '',
			lights: fixtures,
			notes: '',
			builtBy: 'us'
		});
	}
	return out;
}

/** Called in the completion's transaction: records the job's features once (unique job + kind). */
export async function recordFeaturesOfJob(tx: Tx, job: Job): Promise<void> {
	if (!job.propertyId) return;
	const design = (job.frozen.design ?? {}) as Record<string, unknown>;
	const pumpIds = waterFeaturesOf(design)
		.map((f) => f.pumpModelId)
		.filter((id): id is string => typeof id === 'string');
	const pumpNames = new Map<string, string>();
	for (const id of pumpIds) {
		const [pump] = await tx.execute<{ name: string }>(
			sql`select name from pump_models where id = ${id}`
		);
		if (pump) pumpNames.set(id, pump.name);
	}
	const features = featuresFromDesign(design, pumpNames);
	for (const f of features) {
		await tx
			.insert(propertyFeatures)
			.values({
				id: newId(),
				propertyId: job.propertyId,
				jobId: job.id,
				...f,
				notes: `From job J-${job.number}: ${job.title}`
			})
			.onConflictDoNothing();
	}
}

export async function locationOf(propertyId: string, tx: Db = db) {
	const [row] = await tx
		.select()
		.from(propertyLocations)
		.where(eq(propertyLocations.propertyId, propertyId));
	return row ?? null;
}

export async function setPin(propertyId: string, lat: number, lng: number) {
	await propertyRecord(propertyId);
	await db
		.insert(propertyLocations)
		.values({ propertyId, lat, lng, source: 'pin' })
		.onConflictDoUpdate({ target: propertyLocations.propertyId, set: { lat, lng, source: 'pin' } });
}

/** The centre of a US ZIP code from the zipcodes package's data, or null when it is not listed. */
export async function postalCentre(
	postalCode: string
): Promise<{ lat: number; lng: number } | null> {
	const zip = /^\d{5}/.exec(postalCode.trim())?.[0];
	if (!zip) return null;
	// Loaded on first use: the data file is 5 MB and most requests never need it.
	const { default: zipcodes } = await import('zipcodes');
	const found = zipcodes.lookup(zip);
	return found && Number.isFinite(found.latitude) && Number.isFinite(found.longitude)
		? { lat: found.latitude, lng: found.longitude }
		: null;
}

/** Sets the location from the postal code unless staff placed a pin; returns it (or null). */
export async function locateByPostal(propertyId: string, tx: Db = db) {
	const existing = await locationOf(propertyId, tx);
	if (existing?.source === 'pin') return existing;
	const [p] = await tx.select().from(properties).where(eq(properties.id, propertyId));
	const centre = p ? await postalCentre(p.postalCode) : null;
	if (!centre) return existing;
	await tx
		.insert(propertyLocations)
		.values({ propertyId, ...centre, source: 'postal' })
		.onConflictDoUpdate({
			target: propertyLocations.propertyId,
			set: { ...centre, source: 'postal' }
		});
	return { propertyId, ...centre, source: 'postal' };
}

/** Properties found by the homeowner's name, e-mail or address (for the office's Care page). */
export async function findProperties(query: string, limit = 30) {
	const q = `%${query.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
	const rows = await db
		.select({
			id: properties.id,
			street: properties.street,
			town: properties.town,
			postalCode: properties.postalCode,
			name: contacts.name,
			email: contacts.email,
			features: sql<number>`(select count(*)::int from property_features f where f.property_id = ${properties.id})`,
			plan: sql<
				string | null
			>`(select p.name from care_subscriptions s join care_plans p on p.id = s.plan_id where s.property_id = ${properties.id} and s.status <> 'cancelled' limit 1)`
		})
		.from(properties)
		.innerJoin(contacts, eq(contacts.id, properties.contactId))
		.where(
			query
				? or(
						ilike(contacts.name, q),
						ilike(contacts.email, q),
						ilike(properties.street, q),
						ilike(properties.town, q)
					)
				: sql`exists (select 1 from property_features f where f.property_id = ${properties.id})`
		)
		.orderBy(asc(contacts.name))
		.limit(limit);
	return rows;
}
