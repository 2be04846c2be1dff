import { describe, expect, it } from 'vitest';
import {
	detectList,
	itemsToCsv,
	LABOR_TASKS,
	laborToCsv,
	parseCsv,
	previewCsv,
	previewPriceList,
	pumpsToCsv,
	taskHours,
	toCsv,
	withLabor
} from './csv';

describe('price-list CSV', () => {
	it('reads quoted fields, doubled quotes, CRLF and a BOM', () => {
		const text = '\uFEFFa,b\r\n"x, y","say ""hi"""\r\n\r\n"multi\nline",z';
		expect(parseCsv(text)).toEqual([
			['a', 'b'],
			['x, y', 'say "hi"'],
			['multi\nline', 'z']
		]);
		expect(parseCsv(toCsv(parseCsv(text)))).toEqual(parseCsv(text));
	});
	it('carries liner sheet sizes and skimmer and filter ratings both ways', () => {
		const csv =
			'sku,name,category,unit,unit_cost,unit_price,sheet_length_ft,sheet_width_ft,sheet_family,rated_flow_gph,rated_volume_gal\n' +
			'L1,Liner 10 x 15,liner,each,100.00,200.00,15,10,epdm,,\n' +
			'S1,Skimmer,filtration,each,100.00,200.00,,,,2000,\n';
		const p = previewCsv(csv);
		expect(p.ok).toBe(true);
		expect(p.rows[0].item?.attributes).toEqual({
			sheetLengthFt: 15,
			sheetWidthFt: 10,
			sheetFamily: 'epdm'
		});
		expect(p.rows[1].item?.attributes).toEqual({ ratedFlowGph: 2000 });
		const again = previewCsv(itemsToCsv(p.rows.map((r) => r.item!)));
		expect(again.rows.map((r) => r.item)).toEqual(p.rows.map((r) => r.item));
	});
	it('names missing and unknown columns', () => {
		const p = previewCsv('sku,name,colour\nA,B,red\n');
		expect(p.ok).toBe(false);
		expect(p.headerErrors).toEqual(
			expect.arrayContaining([
				'Column “unit_price” is missing',
				'Column “colour” is not one we read'
			])
		);
	});
	it('says a negative price is negative, and an unknown unit which units it takes', () => {
		const p = previewCsv(
			'sku,name,category,unit,unit_cost,unit_price\nA,Thing,other,furlong,-1.00,2.5.0\n'
		);
		expect(p.rows[0].errors).toEqual([
			'unit “furlong” is not one of each, ft, ft2, ft3, yd3, ton, lb, bag, load, day',
			'unit_cost must not be negative',
			'unit_price must be dollars and cents, such as 24.00'
		]);
	});
	it('checks engine attributes through the engine schema', () => {
		const p = previewCsv(
			'sku,name,category,unit,unit_cost,unit_price,pipe_material,pipe_size\nP,Pipe,pipe,ft,1.00,2.00,pvc-sch40,9/8\n'
		);
		expect(p.rows[0].errors.join(' ')).toMatch(/pipe\.size/);
	});
});

const PUMP_HEADER = 'pump_id,name,watts,price,cost,curve_gph_ft';
const LABOR_HEADER = 'kind,labor_id,name,unit,hours,cost_per_hour,price_per_hour,default_rate';

describe('which list a file is', () => {
	it('tells the list from its header row', () => {
		expect(detectList(['sku', 'name'])).toBe('items');
		expect(detectList(PUMP_HEADER.split(','))).toBe('pumps');
		expect(detectList(LABOR_HEADER.split(','))).toBe('labor');
		expect(previewPriceList('name,price\nx,1\n').list).toBeNull();
		expect(previewPriceList('name,price\nx,1\n').headerErrors[0]).toMatch(/choose the list/);
	});
	it('says so when the chosen list is not the one the header names', () => {
		const p = previewPriceList(`${PUMP_HEADER}\npump-a,A,80,200.00,,0:10;500:0\n`, 'labor');
		expect(p.ok).toBe(false);
		expect(p.headerErrors[0]).toBe(
			'This header looks like the pump models list, not the labor rates and task hours'
		);
	});
});

describe('pump models CSV', () => {
	it('reads a pump with its curve in gph and feet, money in cents', () => {
		const p = previewPriceList(
			`${PUMP_HEADER}\npump-a,"Pump A, quiet",85,240.00,130.5,0:12; 300:10.2;600:7.4;1050:0\npump-b,Pump B,140,360,,0:16;1850:0\n`
		);
		expect(p.list).toBe('pumps');
		expect(p.ok).toBe(true);
		if (p.list !== 'pumps') return;
		expect(p.rows[0].pump).toEqual({
			id: 'pump-a',
			name: 'Pump A, quiet',
			watts: 85,
			priceCents: 24000,
			costCents: 13050,
			curve: [
				{ flowGph: 0, headFt: 12 },
				{ flowGph: 300, headFt: 10.2 },
				{ flowGph: 600, headFt: 7.4 },
				{ flowGph: 1050, headFt: 0 }
			]
		});
		expect(p.rows[1].pump?.costCents).toBeNull();
	});
	it('names each bad cell of each bad row', () => {
		const p = previewPriceList(
			[
				PUMP_HEADER,
				'Pump A,A,85,240.00,,0:12;600:0',
				'pump-b,B,-5,-1.00,,0:12;600:0',
				'pump-c,C,85,240.00,,0:12;600:12.5',
				'pump-d,D,85,240.00,,0:12;0:10',
				'pump-e,E,85,240.00,,0:12',
				'pump-f,F,85,240.00,,0:12;600:-1',
				'pump-g,G,85,240.00,,0:12;six hundred:3',
				'pump-h,,85,2.405,,0:12;600:0',
				'pump-h,H,85,240.00,,0:12;600:0'
			].join('\n')
		);
		expect(p.ok).toBe(false);
		const errors = p.rows.map((r) => r.errors.join(' | '));
		expect(errors[0]).toBe('pump_id must be 2 to 40 lower-case letters, digits or dashes');
		expect(errors[1]).toBe(
			'watts must be a whole number above zero, such as 85 | price must not be negative'
		);
		expect(errors[2]).toBe(
			'curve_gph_ft: point 2 “600:12.5”: head must not be higher than the point before'
		);
		expect(errors[3]).toBe(
			'curve_gph_ft: point 2 “0:10”: flow must be higher than the point before'
		);
		expect(errors[4]).toBe('curve_gph_ft: a curve needs at least two points');
		expect(errors[5]).toBe('curve_gph_ft: point 2 “600:-1” is negative');
		expect(errors[6]).toMatch(/point 2 “six hundred:3” is not flow:head/);
		expect(errors[7]).toBe('name is empty | price must be dollars and cents, such as 240.00');
		expect(errors[8]).toBe('pump_id pump-h also appears on line 9');
	});
	it('exports what it imports, formulas neutralised on the way out and restored on the way in', () => {
		const pumps = [
			{
				id: 'pump-x',
				name: '=HYPERLINK("http://x.example")',
				watts: 90,
				priceCents: 19999,
				costCents: null,
				curve: [
					{ flowGph: 0, headFt: 9.5 },
					{ flowGph: 800, headFt: 0 }
				]
			}
		];
		const csv = pumpsToCsv(pumps);
		expect(csv).toContain(`pump-x,"'=HYPERLINK(""http://x.example"")",90,199.99,,0:9.5;800:0\r\n`);
		const p = previewPriceList(csv);
		expect(p.list === 'pumps' && p.rows.map((r) => r.pump)).toEqual(pumps);
	});
});

describe('labor CSV', () => {
	it('reads rates and task hours', () => {
		const p = previewPriceList(
			[
				LABOR_HEADER,
				'rate,installer,Installer,,,38.00,85.00,yes',
				'rate,mason,Stone mason,,,45,110.00,',
				'task,basin,Set a basin,basin,8,,,',
				'task,stone-team-lift,,stone,1.25,,,'
			].join('\r\n')
		);
		expect(p.ok).toBe(true);
		if (p.list !== 'labor') return;
		expect(p.rows.map((r) => r.labor)).toEqual([
			{
				kind: 'rate',
				rate: {
					id: 'installer',
					name: 'Installer',
					costPerHourCents: 3800,
					pricePerHourCents: 8500
				},
				isDefault: true
			},
			{
				kind: 'rate',
				rate: {
					id: 'mason',
					name: 'Stone mason',
					costPerHourCents: 4500,
					pricePerHourCents: 11000
				},
				isDefault: false
			},
			{ kind: 'task', taskId: 'basin', hours: 8 },
			{ kind: 'task', taskId: 'stone-team-lift', hours: 1.25 }
		]);
		const engine = withLabor(
			{ markupPercent: 10, labor: { rates: { branch: 2 } } },
			p.rows.map((r) => r.labor!)
		);
		expect(engine).toEqual({
			markupPercent: 10,
			labor: {
				rateId: 'installer',
				rates: { branch: 2, basin: 8, 'stone-team-lift': 1.25 }
			}
		});
	});
	it('refuses unknown tasks, wrong units, negative hours and money on a task row', () => {
		const p = previewPriceList(
			[
				LABOR_HEADER,
				'task,mowing,Mow,,1,,,',
				'task,trench,Trench,ft2,0.02,,,',
				'task,branch,Branch,branch,-1,,,',
				'task,fixture,Fixture,fixture,1,40.00,,',
				'rate,helper,Helper,,2,-3.00,20.00,maybe',
				'chore,x,,,,,,',
				'rate,installer,Installer,,,38.00,85.00,yes',
				'rate,lead,Lead,,,48.00,95.00,yes',
				'task,crew-day,Day,day,30,,,'
			].join('\n')
		);
		expect(p.ok).toBe(false);
		const errors = p.rows.map((r) => r.errors.join(' | '));
		expect(errors[0]).toMatch(
			/^labor_id “mowing” is not a task we time: dig-hand, dig-machine, basin, /
		);
		expect(errors[1]).toBe("unit “ft2” is not this task's unit: its hours are per ft");
		expect(errors[2]).toBe('hours must not be negative');
		expect(errors[3]).toBe('cost_per_hour is for rate rows: leave it empty');
		expect(errors[4]).toBe(
			'hours is for task rows: leave it empty | cost_per_hour must not be negative | default_rate must be yes, no or empty'
		);
		expect(errors[5]).toBe('kind “chore” must be rate or task');
		expect(errors[6]).toBe('');
		expect(errors[7]).toBe('default_rate: line 8 is already the default rate');
		expect(errors[8]).toBe('hours of a crew day must be 0 to 24');
	});
	it('exports every rate and every task hour the engine uses, and reads them back', () => {
		const engine = { labor: { rateId: 'mason', rates: { 'stone-hoist': 3 } } };
		const rates = [
			{ id: 'installer', name: 'Installer', costPerHourCents: 3800, pricePerHourCents: 8500 },
			{ id: 'mason', name: '+Mason', costPerHourCents: 4500, pricePerHourCents: 11000 }
		];
		const csv = laborToCsv(rates, engine);
		expect(csv.split('\r\n')[2]).toBe("rate,mason,'+Mason,,,45.00,110.00,yes");
		const p = previewPriceList(csv);
		expect(p.ok).toBe(true);
		if (p.list !== 'labor') return;
		expect(p.rows).toHaveLength(2 + LABOR_TASKS.length);
		const back = withLabor(
			{},
			p.rows.map((r) => r.labor!)
		);
		expect(taskHours(back)).toEqual(taskHours(engine));
		expect(taskHours(back).find((t) => t.spec.id === 'stone-hoist')?.hours).toBe(3);
		expect(p.rows.filter((r) => r.labor?.kind === 'rate').map((r) => r.labor)).toEqual([
			{ kind: 'rate', rate: rates[0], isDefault: false },
			{ kind: 'rate', rate: { ...rates[1], name: '+Mason' }, isDefault: true }
		]);
	});
});
