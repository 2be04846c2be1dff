import { describe, expect, it } from 'vitest';
import { fountainIn } from '../../../tests/support/fountain';
import { demoCatalog, demoDesign } from '../../../scripts/seed/demo-catalog';
import { catalogSchema, designSchema } from './schema';
import { crossCheck } from './validate';

const parsed = (
	mutateDesign: (d: ReturnType<typeof demoDesign>) => void = () => {},
	mutateCatalog: (c: ReturnType<typeof demoCatalog>) => void = () => {}
) => {
	const design = demoDesign();
	const catalog = demoCatalog();
	mutateDesign(design);
	mutateCatalog(catalog);
	return crossCheck(designSchema.parse(design), catalogSchema.parse(catalog));
};

describe('cross-checks between the design and the catalog', () => {
	it('the demo passes', () => {
		expect(parsed()).toEqual([]);
	});

	it('an outlet fed twice', () => {
		const errors = parsed((d) => {
			fountainIn(d).branches![1].outletId = 'col-low';
		});
		expect(errors).toContainEqual({
			path: 'design.features.0.outlets.0',
			message: 'This outlet is fed by more than one branch'
		});
		expect(errors).toContainEqual({
			path: 'design.features.0.outlets.1',
			message: 'This outlet has no branch to feed it'
		});
	});

	it('duplicate ids and SKUs', () => {
		const errors = parsed(
			(d) => {
				fountainIn(d).outlets![1].id = 'col-low';
			},
			(c) => {
				c.items![1].sku = c.items![0].sku;
			}
		);
		expect(errors.map((e) => e.path)).toEqual(
			expect.arrayContaining(['design.features.0.outlets.1.id', 'catalog.items.1.sku'])
		);
	});

	it('a supply pipe size the material lacks, and an unknown pinned pump', () => {
		const errors = parsed((d) => {
			fountainIn(d).supply!.pipe = { material: 'poly-sidr15', size: '3' };
			fountainIn(d).pumpModelId = 'pump-x';
		});
		expect(errors.map((e) => e.path)).toEqual(
			expect.arrayContaining([
				'design.features.0.supply.pipe.size',
				'design.features.0.pumpModelId'
			])
		);
	});

	it('an alternate pointing at no choice, and the reserved "base" id', () => {
		const errors = parsed((d) => {
			d.alternates![0].selectedChoiceId = 'marble';
			d.options!.push({ id: 'base', name: 'Base' });
		});
		expect(errors.map((e) => e.path)).toEqual(
			expect.arrayContaining(['design.alternates.0.selectedChoiceId', 'design.options'])
		);
	});

	it('a run on an unknown transformer', () => {
		const errors = parsed((d) => {
			d.lighting!.runs[0].transformerId = 'tx-9';
		});
		expect(errors).toContainEqual({
			path: 'design.lighting.runs.0.transformerId',
			message: 'No transformer "tx-9"'
		});
	});
});
