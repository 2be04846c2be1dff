// The owner's care plans and the season settings (windows, the crews' yard, travel speed).
import { asc, eq } from 'drizzle-orm';
import { db } from '../platform/db';
import { carePlans, careSeasonSettings, type CarePlan } from '../platform/db/schema';
import { newId } from '../platform/crypto';
import type { PlanInput } from '$lib/schema/care';
import { SEASON_DEFAULTS } from '$lib/care/seasons';
import type { PriceTable } from '$lib/care/kinds';
import { CareError, type Db } from './db';

export async function listPlans(options: { activeOnly?: boolean } = {}): Promise<CarePlan[]> {
	const rows = await db.select().from(carePlans).orderBy(asc(carePlans.name));
	return options.activeOnly ? rows.filter((p) => p.active) : rows;
}

export async function planById(id: string, tx: Db = db): Promise<CarePlan> {
	const [row] = await tx.select().from(carePlans).where(eq(carePlans.id, id));
	if (!row) throw new CareError('not_found', 'There is no such plan.');
	return row;
}

function pricesOf(input: PlanInput['prices']): PriceTable {
	const out: PriceTable = {};
	for (const [kind, sizes] of Object.entries(input)) {
		const kept = Object.fromEntries(Object.entries(sizes ?? {}).filter(([, c]) => c > 0));
		if (Object.keys(kept).length) out[kind as keyof PriceTable] = kept;
	}
	return out;
}

export async function savePlan(id: string | null, input: PlanInput): Promise<string> {
	const values = { ...input, prices: pricesOf(input.prices) };
	if (!id) {
		const newPlanId = newId();
		await db.insert(carePlans).values({ id: newPlanId, ...values });
		return newPlanId;
	}
	const rows = await db
		.update(carePlans)
		.set(values)
		.where(eq(carePlans.id, id))
		.returning({ id: carePlans.id });
	if (!rows.length) throw new CareError('not_found', 'There is no such plan.');
	return id;
}

export type SeasonConfig = typeof SEASON_DEFAULTS & {
	depotLat: number | null;
	depotLng: number | null;
	speedKmh: number;
};

export async function seasonSettings(tx: Db = db): Promise<SeasonConfig> {
	const [row] = await tx.select().from(careSeasonSettings).where(eq(careSeasonSettings.id, 1));
	return row ?? { ...SEASON_DEFAULTS, depotLat: null, depotLng: null, speedKmh: 40 };
}

export async function saveSeasonSettings(
	input: Omit<SeasonConfig, 'depotLat' | 'depotLng'> & {
		depotLat: number;
		depotLng: number;
	}
) {
	await db
		.insert(careSeasonSettings)
		.values({ id: 1, ...input })
		.onConflictDoUpdate({ target: careSeasonSettings.id, set: input });
}
