// The yard work settings on the price list page (paths, dry creeks and planting): the fields and
// their current values. Each field is one number of the engine's settings, named by its path.
import { settingsSchema } from './schema';

export type YardGroup = 'hardscape' | 'drainage' | 'planting';
export interface YardField {
	/** The form field's name: the setting's path, "drainage.designRainInPerHr". */
	name: string;
	label: string;
}

const f = (name: string, label: string): YardField => ({ name, label });
export const YARD_FIELDS: { group: YardGroup; title: string; fields: YardField[] }[] = [
	{
		group: 'drainage',
		title: 'Dry creeks and drainage',
		fields: [
			f('drainage.designRainInPerHr', 'Design rain (in/h)'),
			f('drainage.stormMinutes', 'Design storm (minutes)'),
			f('drainage.cobbleManningN', 'Cobble roughness, Manning n'),
			f('drainage.crewSize', 'Crew (people)'),
			f('drainage.digFt3PerPersonHour', 'Digging (ft³ per person-hour)'),
			f('drainage.stoneTonsPerPersonHour', 'Cobble and gravel (tons per person-hour)'),
			f('drainage.fabricFt2PerPersonHour', 'Fabric (ft² per person-hour)')
		]
	},
	{
		group: 'hardscape',
		title: 'Paths and patios',
		fields: [
			f('hardscape.baseCompactionFactor', 'Base compaction factor'),
			f('hardscape.beddingCompactionFactor', 'Bedding compaction factor'),
			f('hardscape.crewSize', 'Crew (people)'),
			f('hardscape.digFt3PerPersonHour', 'Digging (ft³ per person-hour)'),
			f('hardscape.baseFt3PerPersonHour', 'Base and bedding (ft³ per person-hour)'),
			f('hardscape.flagstoneFt2PerPersonHour', 'Flagstone (ft² per person-hour)'),
			f('hardscape.paverFt2PerPersonHour', 'Pavers (ft² per person-hour)'),
			f('hardscape.edgeFtPerPersonHour', 'Edge restraint (ft per person-hour)'),
			f('hardscape.jointFt2PerPersonHour', 'Joint fill (ft² per person-hour)'),
			f('hardscape.stepPersonHours', 'A step (person-hours)')
		]
	},
	{
		group: 'planting',
		title: 'Planting',
		fields: [
			f('planting.crewSize', 'Crew (people)'),
			f('planting.plantPersonHours.1-gal', 'A 1 gal plant (person-hours)'),
			f('planting.plantPersonHours.2-gal', 'A 2 gal plant (person-hours)'),
			f('planting.plantPersonHours.5-gal', 'A 5 gal plant (person-hours)'),
			f('planting.plantPersonHours.15-gal', 'A 15 gal plant (person-hours)'),
			f('planting.mulchPersonHoursPerYd3', 'Mulch (person-hours per yd³)'),
			f('planting.amendPersonHoursPerYd3', 'Amendment (person-hours per yd³)')
		]
	}
];

const get = (obj: unknown, path: string[]): unknown =>
	path.reduce<unknown>(
		(o, k) => (o && typeof o === 'object' ? (o as Record<string, unknown>)[k] : undefined),
		obj
	);

/** Every yard field's current value (the firm's, else the engine's default), by field name. */
export function yardValues(engine: unknown): Record<string, number> {
	const parsed = settingsSchema.safeParse(engine ?? {});
	const settings = parsed.success ? parsed.data : settingsSchema.parse({});
	const out: Record<string, number> = {};
	for (const group of YARD_FIELDS) {
		for (const field of group.fields) {
			out[field.name] = get(settings, field.name.split('.')) as number;
		}
	}
	return out;
}
