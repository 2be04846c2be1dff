import { describe, expect, it } from 'vitest';
import { parseCsv, previewCsv, toCsv } from './pricelist-csv';

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
	it('checks engine attributes through the engine schema', () => {
		const p = previewCsv(
			'sku,name,category,unit,unit_cost,unit_price,pipe_material,pipe_size\nP,Pipe,pipe,ft,1.00,2.00,pvc-sch40,9/8\n'
		);
		expect(p.rows[0].errors.join(' ')).toMatch(/pipe\.size/);
	});
});
