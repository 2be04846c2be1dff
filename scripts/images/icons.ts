/** The Copperleaf mark (a copper leaf over a ripple, on deep pool green) and an ICO packer. */

export function faviconSvg(): string {
	return `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 64 64">
<rect width="64" height="64" rx="14" fill="#164346"/>
<path d="M32 10 C44 16 48 28 40 38 C36 42 32 43 32 43 C32 43 28 42 24 38 C16 28 20 16 32 10 Z" fill="#c0682f"/>
<path d="M32 14 L32 42" stroke="#7d3c17" stroke-width="2" stroke-linecap="round"/>
<path d="M11 48 c5 -4 10 -4 15 0 s10 4 15 0 s10 -4 15 0" stroke="#a9d1d2" stroke-width="4" fill="none" stroke-linecap="round"/>
</svg>
`;
}

/** Pack PNG images into a .ico file (PNG-in-ICO, supported by every current browser). */
export function ico(pngs: Buffer[], sizes: number[]): Buffer {
	const header = Buffer.alloc(6);
	header.writeUInt16LE(0, 0);
	header.writeUInt16LE(1, 2);
	header.writeUInt16LE(pngs.length, 4);
	const entries: Buffer[] = [];
	let offset = 6 + 16 * pngs.length;
	pngs.forEach((png, i) => {
		const e = Buffer.alloc(16);
		e.writeUInt8(sizes[i] >= 256 ? 0 : sizes[i], 0);
		e.writeUInt8(sizes[i] >= 256 ? 0 : sizes[i], 1);
		e.writeUInt8(0, 2);
		e.writeUInt8(0, 3);
		e.writeUInt16LE(1, 4);
		e.writeUInt16LE(32, 6);
		e.writeUInt32LE(png.length, 8);
		e.writeUInt32LE(offset, 12);
		offset += png.length;
		entries.push(e);
	});
	return Buffer.concat([header, ...entries, ...pngs]);
}
