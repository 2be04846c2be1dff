// The purchase order as a PDF (pdf-lib, standard Helvetica: nothing to load from disk): the
// firm, the order number, the job and where to deliver, the expected date and the delivery
// note, each line with its quantity, cost and extension, and the total.
import { PDFDocument, StandardFonts, rgb, type PDFFont, type PDFPage } from 'pdf-lib';
import { formatCents } from '$lib/money';
import { formatQuantity } from '$lib/quantity';

export interface OrderDocument {
	firm: { name: string; phone: string; email: string };
	number: number;
	jobRef: string;
	supplier: string;
	deliverTo: string;
	expectedOn: string | null;
	deliveryNote: string;
	lines: {
		sku: string;
		description: string;
		unit: string;
		quantity: number;
		unitCostCents: number;
		extendedCents: number;
	}[];
	totalCents: number;
}

// The standard fonts encode WinAnsi only: anything else is written as its closest plain letter.
const WIN_ANSI_EXTRA = new Set([...'€‚ƒ„…†‡ˆ‰Š‹ŒŽ‘’“”•–—˜™š›œžŸ']);
export function winAnsi(text: string): string {
	return [...text.normalize('NFC')]
		.map((ch) => {
			const code = ch.codePointAt(0)!;
			if (
				(code >= 0x20 && code <= 0x7e) ||
				(code >= 0xa0 && code <= 0xff) ||
				WIN_ANSI_EXTRA.has(ch)
			) {
				return ch;
			}
			if (ch === '−') return '-';
			const plain = ch.normalize('NFKD').replace(/[^\x20-\x7e]/g, '');
			return plain || '?';
		})
		.join('');
}

export async function purchaseOrderPdf(doc: OrderDocument): Promise<Uint8Array> {
	const pdf = await PDFDocument.create();
	pdf.setTitle(`Purchase order PO-${doc.number}`);
	pdf.setAuthor(winAnsi(doc.firm.name));
	const font = await pdf.embedFont(StandardFonts.Helvetica);
	const bold = await pdf.embedFont(StandardFonts.HelveticaBold);
	let page = pdf.addPage([612, 792]); // US Letter
	let y = 740;
	const write = (p: PDFPage, text: string, x: number, f: PDFFont = font, size = 10) =>
		p.drawText(winAnsi(text), { x, y, size, font: f, color: rgb(0.1, 0.1, 0.1) });
	const right = (p: PDFPage, text: string, xRight: number, f: PDFFont = font, size = 10) => {
		const t = winAnsi(text);
		p.drawText(t, { x: xRight - f.widthOfTextAtSize(t, size), y, size, font: f });
	};
	write(page, doc.firm.name, 50, bold, 16);
	right(page, `Purchase order PO-${doc.number}`, 562, bold, 14);
	y -= 18;
	write(page, `${doc.firm.phone} · ${doc.firm.email}`, 50);
	y -= 30;
	for (const [label, value] of [
		['To', doc.supplier],
		['For job', doc.jobRef],
		['Deliver to', doc.deliverTo || 'Call for the address'],
		['Needed by', doc.expectedOn ?? 'As soon as possible'],
		['Delivery note', doc.deliveryNote || '—']
	] as const) {
		write(page, label, 50, bold);
		write(page, value.slice(0, 90), 150);
		y -= 16;
	}
	y -= 14;
	const header = () => {
		write(page, 'Item', 50, bold);
		right(page, 'Qty', 380, bold);
		write(page, 'Unit', 390, bold);
		right(page, 'Unit cost', 490, bold);
		right(page, 'Amount', 562, bold);
		y -= 6;
		page.drawLine({ start: { x: 50, y }, end: { x: 562, y }, thickness: 0.5 });
		y -= 14;
	};
	header();
	for (const l of doc.lines) {
		if (y < 80) {
			page = pdf.addPage([612, 792]);
			y = 740;
			header();
		}
		write(page, `${l.sku}  ${l.description}`.slice(0, 58), 50);
		right(page, formatQuantity(l.quantity), 380);
		write(page, l.unit, 390);
		right(page, formatCents(l.unitCostCents), 490);
		right(page, formatCents(l.extendedCents), 562);
		y -= 16;
	}
	y -= 4;
	page.drawLine({ start: { x: 390, y: y + 10 }, end: { x: 562, y: y + 10 }, thickness: 0.5 });
	write(page, 'Total', 390, bold);
	right(page, formatCents(doc.totalCents), 562, bold);
	return pdf.save();
}
