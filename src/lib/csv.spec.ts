import { describe, expect, it } from 'vitest';
import { csvCell, csvLine } from './csv';

describe('csv', () => {
	it('leaves plain cells alone and quotes only where RFC 4180 needs it', () => {
		expect(csvCell('Linden Ford')).toBe('Linden Ford');
		expect(csvCell('Quill, Mara')).toBe('"Quill, Mara"');
		expect(csvCell('the "big" boulder')).toBe('"the ""big"" boulder"');
		expect(csvCell('two\nlines')).toBe('"two\nlines"');
		expect(csvCell('cr\rhere')).toBe('"cr\rhere"');
		expect(csvCell(null)).toBe('');
		expect(csvCell(1001)).toBe('1001');
	});

	it('neutralises cells a spreadsheet would run as formulas', () => {
		expect(csvCell('=HYPERLINK("http://x","y")')).toBe('"\'=HYPERLINK(""http://x"",""y"")"');
		expect(csvCell('+1 555 0100')).toBe("'+1 555 0100");
		expect(csvCell('-2+3')).toBe("'-2+3");
		expect(csvCell('@SUM(A1)')).toBe("'@SUM(A1)");
		expect(csvCell('\t=1')).toBe("'\t=1");
		expect(csvCell('a=b')).toBe('a=b');
	});

	it('joins a line with commas and ends it with CRLF', () => {
		expect(csvLine(['a', 'b,c', null])).toBe('a,"b,c",\r\n');
	});
});
