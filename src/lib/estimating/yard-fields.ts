// The yard design settings on the price list page (the design rain and storm, the cobble's
// roughness, the compaction factors): the fields and their current values. Each field is one number
// of the engine's settings, named by its path. The crew's rates for yard work are labor rates.
import { settingsSchema } from './schema';

export type YardGroup = 'hardscape' | 'drainage';
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
			f('drainage.cobbleManningN', 'Cobble roughness, Manning n')
		]
	},
	{
		group: 'hardscape',
		title: 'Paths and patios',
		fields: [
			f('hardscape.baseCompactionFactor', 'Base compaction factor (loose ÷ compacted)'),
			f('hardscape.beddingCompactionFactor', 'Bedding compaction factor (loose ÷ compacted)')
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
