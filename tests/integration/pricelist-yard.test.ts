// The yard work settings on the price list: a bad figure comes back beside its field and nothing
// is written; good figures reach the engine (a heavier design rain sizes a wider dry creek).
import { beforeEach, describe, expect, it } from 'vitest';
import { estimate } from '$lib/estimating';
import { yardValues } from '$lib/estimating/yard-fields';
import { catalogSchema } from '$lib/estimating/schema';
import { starterDrainage } from '$lib/estimating/starter-yard';
import { estimatingConfig, loadCatalog } from '$lib/server/pricelist/catalog';
import { actions } from '../../src/routes/office/price-list/+page.server';
import { resetDatabase } from '../support/database';
import { makeUser, seedFirm } from './fixtures';
import { seedCatalog } from './estimates-fixtures';

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
	await seedCatalog();
});

async function postYard(user: { id: string; role: string }, fields: Record<string, string>) {
	const body = new FormData();
	for (const [k, v] of Object.entries(fields)) body.append(k, v);
	const url = 'http://127.0.0.1/office/price-list?/yard';
	return (await actions.yard({
		locals: { user: { ...user, email: `${user.role}@test.example`, name: user.role } },
		url: new URL(url),
		request: new Request(url, { method: 'POST', body })
	} as never)) as { status?: number; data?: Record<string, unknown> } & Record<string, unknown>;
}

const current = async () =>
	Object.fromEntries(
		Object.entries(yardValues((await estimatingConfig()).engine)).map(([k, v]) => [k, String(v)])
	);

describe('the yard work settings', () => {
	it('puts each message beside its field and writes nothing', async () => {
		const owner = await makeUser('owner');
		const before = await estimatingConfig();
		const fields = {
			...(await current()),
			'drainage.designRainInPerHr': 'lots',
			'drainage.cobbleManningN': '2',
			'hardscape.baseCompactionFactor': '0.5'
		};
		const result = await postYard(owner, fields);
		expect(result.status).toBe(400);
		expect(result.data).toMatchObject({
			form: 'yard',
			errors: {
				'drainage.designRainInPerHr': 'Enter a number',
				'drainage.cobbleManningN': 'At most 1',
				'hardscape.baseCompactionFactor': 'At least 1'
			}
		});
		expect((await estimatingConfig()).engine).toEqual(before.engine);
	});

	it('stores good figures, and the engine sizes the creek with the firm’s design rain', async () => {
		const owner = await makeUser('owner');
		const catalog = catalogSchema.parse(await loadCatalog());
		const design = { name: 'Creek', features: [starterDrainage(catalog.items)] };
		const widthAt = async () => {
			const r = estimate(design, await loadCatalog());
			if (!r.ok) throw new Error(JSON.stringify(r.errors));
			return r.features[0].drainage!;
		};
		const before = await widthAt();
		const result = await postYard(owner, {
			...(await current()),
			'drainage.designRainInPerHr': String(before.rainInPerHr * 3)
		});
		expect(result).toMatchObject({ form: 'yard', saved: 'yard' });
		const after = await widthAt();
		expect(after.rainInPerHr).toBe(before.rainInPerHr * 3);
		expect(after.peakFlowM3s).toBeCloseTo(before.peakFlowM3s * 3, 12);
		expect(after.soakaway!.gravelVolumeM3).toBeGreaterThan(before.soakaway!.gravelVolumeM3);
	});

	it('refuses a salesperson', async () => {
		const sales = await makeUser('sales');
		await expect(postYard(sales, await current())).rejects.toMatchObject({ status: 403 });
	});
});
