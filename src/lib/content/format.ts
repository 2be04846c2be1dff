import type { Facts } from './schema';

const n = (x: number) => x.toLocaleString('en-US');

/** The facts of a project as label/value rows, in a fixed order, with US units. */
export function factRows(f: Facts): { label: string; value: string }[] {
	const rows: { label: string; value: string | undefined }[] = [
		{ label: 'Basin', value: f.basinGallons ? `${n(f.basinGallons)} gallons` : undefined },
		{ label: 'Pump flow', value: f.pumpGph ? `${n(f.pumpGph)} gallons per hour` : undefined },
		{ label: 'Outlets', value: f.outlets !== undefined ? n(f.outlets) : undefined },
		{ label: 'Lights', value: f.lights !== undefined ? n(f.lights) : undefined },
		{ label: 'Deepest point', value: f.maxDepthIn ? `${n(f.maxDepthIn)} inches` : undefined },
		{ label: 'Wall height', value: f.wallHeightIn ? `${n(f.wallHeightIn)} inches` : undefined },
		{ label: 'Length', value: f.lengthFt ? `${n(f.lengthFt)} feet` : undefined },
		{ label: 'Area', value: f.areaSqFt ? `${n(f.areaSqFt)} square feet` : undefined },
		{ label: 'Stone', value: f.stones?.join(', ') },
		{
			label: 'Heaviest stone',
			value: f.heaviestStoneLb ? `about ${n(f.heaviestStoneLb)} lb` : undefined
		},
		{
			label: 'On site',
			value: f.daysOnSite ? `${n(f.daysOnSite)} ${f.daysOnSite === 1 ? 'day' : 'days'}` : undefined
		}
	];
	return rows.filter((r): r is { label: string; value: string } => Boolean(r.value));
}
