// The firm's labor rates (how long each kind of work takes), the crew and the machine threshold,
// edited on the price list page: one field per rate of the engine's list (LABOR_TASKS), written into
// the engine's settings as the labor CSV import writes them.
import { z } from 'zod';
import { settingsSchema } from '$lib/estimating/schema';
import { db } from '../platform/db';
import { estimatingSettings } from '../platform/db/schema';
import { estimatingConfig } from './catalog';
import { LABOR_TASKS, withLabor, type LaborRecord } from './csv-labor';

const number = (max: number, tooBig: string) =>
	z
		.string()
		.trim()
		.min(1, 'Enter a number')
		.transform(Number)
		.refine(Number.isFinite, 'Enter a number, such as 1.5')
		.refine((n) => n >= 0, 'Must not be negative')
		.refine((n) => n <= max, tooBig);

export const taskRatesFormSchema = z.object({
	...Object.fromEntries(
		LABOR_TASKS.map((t) => [
			t.id,
			t.id === 'crew-day'
				? number(24, 'At most 24 hours').refine((n) => n > 0, 'Above zero')
				: number(1000, 'At most 1000 hours')
		])
	),
	baseCrewSize: number(50, 'At most 50 people').refine(
		(n) => Number.isInteger(n) && n >= 1,
		'A whole number of people, at least one'
	),
	machineDigAboveYd3: number(10000, 'At most 10,000 yd³'),
	truckCapacityTons: number(100, 'At most 100 tons').refine((n) => n > 0, 'Above zero')
});

export type TaskRatesForm = Record<string, number>;

/** Writes the rates, the base crew and the machine and truck figures; other settings stay. */
export async function saveTaskRates(input: TaskRatesForm): Promise<string[]> {
	const current = await estimatingConfig();
	const records: LaborRecord[] = LABOR_TASKS.map((t) => ({
		kind: 'task',
		taskId: t.id,
		hours: input[t.id]
	}));
	const withRates = withLabor({ ...(current.engine as Record<string, unknown>) }, records);
	const labor = {
		...(withRates.labor as Record<string, unknown>),
		baseCrewSize: input.baseCrewSize,
		machineDigAboveYd3: input.machineDigAboveYd3
	};
	const equipment = {
		...((withRates as { equipment?: Record<string, unknown> }).equipment ?? {}),
		truckCapacityTons: input.truckCapacityTons
	};
	const engine = { ...withRates, labor, equipment };
	const check = settingsSchema.safeParse(engine);
	if (!check.success) return check.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
	await db
		.insert(estimatingSettings)
		.values({ id: 1, engine, terms: current.terms, validDays: current.validDays })
		.onConflictDoUpdate({ target: estimatingSettings.id, set: { engine } });
	return [];
}
