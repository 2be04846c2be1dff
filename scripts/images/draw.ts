/**
 * A small vocabulary for drawing garden scenes as SVG: stones, gravel, water, planting, walls,
 * light. Everything is procedural and seeded, so a re-render gives the same pictures.
 */

export const W = 1600;
export const H = 1067;

export type Rand = () => number;

/** mulberry32: a tiny seeded generator. */
export function rng(seed: number): Rand {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

export const between = (r: Rand, a: number, b: number) => a + (b - a) * r();
export const pick = <T>(r: Rand, xs: readonly T[]): T => xs[Math.floor(r() * xs.length)];
const f = (n: number) => n.toFixed(1);

/** A closed, smooth, irregular blob around (cx, cy). `flat` squashes the bottom. */
export function blobPath(
	r: Rand,
	cx: number,
	cy: number,
	rx: number,
	ry: number,
	jitter = 0.14,
	n = 9,
	flat = 0.35
): string {
	const pts: [number, number][] = [];
	const phase = r() * Math.PI * 2;
	for (let i = 0; i < n; i++) {
		const a = phase + (i / n) * Math.PI * 2;
		const k = 1 + between(r, -jitter, jitter);
		let y = Math.sin(a) * ry * k;
		if (y > 0) y *= 1 - flat;
		pts.push([cx + Math.cos(a) * rx * k, cy + y]);
	}
	const mid = (p: [number, number], q: [number, number]) => [(p[0] + q[0]) / 2, (p[1] + q[1]) / 2];
	let d = '';
	for (let i = 0; i < n; i++) {
		const p = pts[i];
		const q = pts[(i + 1) % n];
		const m = mid(p, q);
		if (i === 0) {
			const m0 = mid(pts[n - 1], p);
			d += `M${f(m0[0])},${f(m0[1])}`;
		}
		d += `Q${f(p[0])},${f(p[1])} ${f(m[0])},${f(m[1])}`;
	}
	return d + 'Z';
}

/** Shared gradients: every scene's <defs>. */
export function defs(extra = ''): string {
	return `<defs>
<radialGradient id="shade" cx="35%" cy="28%" r="80%">
  <stop offset="0" stop-color="#fff" stop-opacity=".38"/>
  <stop offset=".45" stop-color="#fff" stop-opacity="0"/>
  <stop offset="1" stop-color="#000" stop-opacity=".42"/>
</radialGradient>
<radialGradient id="glow">
  <stop offset="0" stop-color="#ffe2a8" stop-opacity=".6"/>
  <stop offset=".35" stop-color="#ffc878" stop-opacity=".25"/>
  <stop offset="1" stop-color="#ffb45a" stop-opacity="0"/>
</radialGradient>
<radialGradient id="shadow">
  <stop offset="0" stop-color="#1a1f1b" stop-opacity=".45"/>
  <stop offset="1" stop-color="#1a1f1b" stop-opacity="0"/>
</radialGradient>
<linearGradient id="waterV" x1="0" y1="0" x2="0" y2="1">
  <stop offset="0" stop-color="#9cc3c6"/>
  <stop offset=".5" stop-color="#4f8a93"/>
  <stop offset="1" stop-color="#2b5660"/>
</linearGradient>
<linearGradient id="sheet" x1="0" y1="0" x2="0" y2="1">
  <stop offset="0" stop-color="#d9eef0" stop-opacity=".95"/>
  <stop offset="1" stop-color="#9cc8cc" stop-opacity=".7"/>
</linearGradient>
${extra}
</defs>`;
}

export type Time = 'day' | 'dusk';

export function sky(time: Time, horizon: number): string {
	const [a, b] = time === 'day' ? ['#c9dde3', '#eef1e6'] : ['#1d2a44', '#b46e4c'];
	return `<linearGradient id="sky" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="${a}"/><stop offset="1" stop-color="${b}"/></linearGradient>
<rect width="${W}" height="${horizon + 40}" fill="url(#sky)"/>`;
}

/** Ground from the horizon down: a lawn or bed colour with a soft perspective gradient. */
export function ground(horizon: number, near = '#5e7a3c', far = '#8aa05c'): string {
	return `<linearGradient id="ground" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="${far}"/><stop offset="1" stop-color="${near}"/></linearGradient>
<rect y="${horizon}" width="${W}" height="${H - horizon}" fill="url(#ground)"/>`;
}

/** Distant trees along the horizon. */
export function treeLine(
	r: Rand,
	horizon: number,
	colors = ['#4d6440', '#3f5636', '#5b7348']
): string {
	let s = '';
	for (let x = -60; x < W + 60; x += between(r, 50, 110)) {
		const h = between(r, 120, 260);
		s += `<path d="${blobPath(r, x, horizon - h / 2, between(r, 60, 110), h / 2, 0.2, 10, 0)}" fill="${pick(r, colors)}"/>`;
	}
	return s;
}

/** A board fence across the back of the garden. */
export function fence(r: Rand, top: number, bottom: number, color = '#8a6d52'): string {
	let s = `<rect y="${top}" width="${W}" height="${bottom - top}" fill="${color}"/>`;
	for (let x = 0; x < W; x += 46) {
		const shade = between(r, -0.08, 0.08);
		s += `<rect x="${x}" y="${top - between(r, 0, 6)}" width="44" height="${bottom - top + 6}" fill="${shade > 0 ? '#fff' : '#000'}" opacity="${Math.abs(shade).toFixed(2)}"/>`;
		s += `<line x1="${x + 45}" y1="${top}" x2="${x + 45}" y2="${bottom}" stroke="#3b2e22" stroke-opacity=".35" stroke-width="2"/>`;
	}
	s += `<rect y="${top + (bottom - top) * 0.25}" width="${W}" height="10" fill="#000" opacity=".12"/>`;
	return s;
}

/** A clipped hedge. */
export function hedge(
	r: Rand,
	top: number,
	bottom: number,
	colors = ['#3e5a33', '#4a6a3a', '#36502e']
): string {
	let s = `<rect y="${top + 30}" width="${W}" height="${bottom - top - 30}" fill="${colors[0]}"/>`;
	for (let i = 0; i < 160; i++) {
		const x = between(r, -20, W + 20);
		const y = between(r, top, bottom - 20);
		s += `<circle cx="${f(x)}" cy="${f(y)}" r="${f(between(r, 18, 46))}" fill="${pick(r, colors)}" opacity=".9"/>`;
	}
	return s;
}

/** A house or garden wall in stucco or stone. */
export function houseWall(top: number, bottom: number, color = '#d9cdb8'): string {
	let s = `<rect y="${top}" width="${W}" height="${bottom - top}" fill="${color}"/>`;
	s += `<rect y="${top}" width="${W}" height="${bottom - top}" fill="url(#wallLight)"/>`;
	return s;
}

export interface StoneOpts {
	color: string;
	jitter?: number;
	speckle?: string;
	drilled?: boolean;
	flat?: number;
}

/** A stone with shading, a contact shadow and optional speckle. */
export function stone(
	r: Rand,
	cx: number,
	cy: number,
	rx: number,
	ry: number,
	o: StoneOpts
): string {
	const d = blobPath(r, cx, cy, rx, ry, o.jitter ?? 0.12, 9, o.flat ?? 0.35);
	let s = `<ellipse cx="${f(cx + rx * 0.1)}" cy="${f(cy + ry * 0.62)}" rx="${f(rx * 1.15)}" ry="${f(ry * 0.32)}" fill="url(#shadow)"/>`;
	s += `<path d="${d}" fill="${o.color}"/>`;
	if (o.speckle) {
		for (let i = 0; i < Math.min(90, (rx * ry) / 140); i++) {
			const a = r() * Math.PI * 2;
			const k = Math.sqrt(r()) * 0.82;
			s += `<circle cx="${f(cx + Math.cos(a) * rx * k)}" cy="${f(cy + Math.sin(a) * ry * k * 0.8)}" r="${f(between(r, 1, 2.6))}" fill="${o.speckle}" opacity=".55"/>`;
		}
	}
	s += `<path d="${d}" fill="url(#shade)"/>`;
	return s;
}

/** Water bubbling out of the top of a drilled stone. */
export function bubbler(cx: number, top: number, height: number, width: number): string {
	const w = width / 2;
	return `<path d="M${f(cx - w)},${f(top)} Q${f(cx - w * 0.6)},${f(top - height)} ${f(cx)},${f(top - height * 1.05)} Q${f(cx + w * 0.6)},${f(top - height)} ${f(cx + w)},${f(top)} Z" fill="#e4f3f4" opacity=".85"/>
<path d="M${f(cx - w * 1.5)},${f(top + 4)} Q${f(cx - w * 1.3)},${f(top - height * 0.3)} ${f(cx - w * 0.5)},${f(top - height * 0.6)}" stroke="#d7eef0" stroke-width="3" fill="none" opacity=".8"/>
<path d="M${f(cx + w * 1.5)},${f(top + 4)} Q${f(cx + w * 1.3)},${f(top - height * 0.3)} ${f(cx + w * 0.5)},${f(top - height * 0.6)}" stroke="#d7eef0" stroke-width="3" fill="none" opacity=".8"/>
<ellipse cx="${f(cx)}" cy="${f(top + 3)}" rx="${f(w * 2.2)}" ry="${f(w * 0.45)}" fill="#bfe0e3" opacity=".5"/>`;
}

/** Loose pebbles or gravel filling an ellipse, smaller towards the back. */
export function gravel(
	r: Rand,
	cx: number,
	cy: number,
	rx: number,
	ry: number,
	palette: string[],
	count = 420,
	size = 9,
	base?: string
): string {
	let s = `<ellipse cx="${cx}" cy="${cy}" rx="${rx}" ry="${ry}" fill="${base ?? palette[0]}"/>`;
	const pts: [number, number][] = [];
	for (let i = 0; i < count; i++) {
		const a = r() * Math.PI * 2;
		const k = Math.sqrt(r());
		pts.push([cx + Math.cos(a) * rx * k, cy + Math.sin(a) * ry * k]);
	}
	pts.sort((p, q) => p[1] - q[1]);
	for (const [x, y] of pts) {
		const depth = 0.55 + 0.45 * ((y - (cy - ry)) / (2 * ry));
		const w = size * depth * between(r, 0.6, 1.3);
		s += `<ellipse cx="${f(x)}" cy="${f(y)}" rx="${f(w)}" ry="${f(w * 0.62)}" fill="${pick(r, palette)}"/>`;
		s += `<ellipse cx="${f(x - w * 0.25)}" cy="${f(y - w * 0.22)}" rx="${f(w * 0.45)}" ry="${f(w * 0.22)}" fill="#fff" opacity=".18"/>`;
	}
	return s;
}

/** Gravel along a band following a polyline (for paths and creek beds). */
export function gravelAlong(
	r: Rand,
	pts: [number, number][],
	width: (t: number) => number,
	palette: string[],
	perStep = 26,
	size = 10
): string {
	let s = '';
	const stones: [number, number, number][] = [];
	for (let i = 0; i < pts.length - 1; i++) {
		const [x1, y1] = pts[i];
		const [x2, y2] = pts[i + 1];
		for (let j = 0; j < perStep; j++) {
			const t = r();
			const x = x1 + (x2 - x1) * t;
			const y = y1 + (y2 - y1) * t;
			const wd = width((i + t) / (pts.length - 1));
			const off = between(r, -1, 1) * wd;
			const len = Math.hypot(x2 - x1, y2 - y1) || 1;
			const nx = -(y2 - y1) / len;
			const ny = (x2 - x1) / len;
			stones.push([x + nx * off, y + ny * off * 0.5, (size * wd) / 60]);
		}
	}
	stones.sort((a, b) => a[1] - b[1]);
	for (const [x, y, k] of stones) {
		const w = Math.max(2, k * between(r, 0.6, 1.4));
		s += `<ellipse cx="${f(x)}" cy="${f(y)}" rx="${f(w)}" ry="${f(w * 0.6)}" fill="${pick(r, palette)}"/>`;
		s += `<ellipse cx="${f(x - w * 0.25)}" cy="${f(y - w * 0.2)}" rx="${f(w * 0.45)}" ry="${f(w * 0.2)}" fill="#fff" opacity=".16"/>`;
	}
	return s;
}

/** A smooth ribbon along a polyline (stream, path bed, creek). */
export function ribbon(pts: [number, number][], width: (t: number) => number): string {
	const left: [number, number][] = [];
	const right: [number, number][] = [];
	pts.forEach(([x, y], i) => {
		const [px, py] = pts[Math.max(0, i - 1)];
		const [qx, qy] = pts[Math.min(pts.length - 1, i + 1)];
		const len = Math.hypot(qx - px, qy - py) || 1;
		const nx = -(qy - py) / len;
		const ny = (qx - px) / len;
		const w = width(i / (pts.length - 1));
		left.push([x + nx * w, y + ny * w * 0.55]);
		right.push([x - nx * w, y - ny * w * 0.55]);
	});
	const all = [...left, ...right.reverse()];
	return 'M' + all.map(([x, y]) => `${f(x)},${f(y)}`).join('L') + 'Z';
}

/** A rounded shrub made of overlapping leaf masses. */
export function shrub(r: Rand, cx: number, cy: number, size: number, colors: string[]): string {
	let s = `<ellipse cx="${f(cx)}" cy="${f(cy + size * 0.15)}" rx="${f(size * 1.1)}" ry="${f(size * 0.28)}" fill="url(#shadow)"/>`;
	for (let i = 0; i < 14; i++) {
		const a = r() * Math.PI;
		const k = r() * size * 0.7;
		s += `<circle cx="${f(cx + Math.cos(a) * k * 1.2 - size * 0.1)}" cy="${f(cy - Math.sin(a) * k)}" r="${f(size * between(r, 0.3, 0.55))}" fill="${pick(r, colors)}"/>`;
	}
	s += `<circle cx="${f(cx - size * 0.25)}" cy="${f(cy - size * 0.5)}" r="${f(size * 0.35)}" fill="#fff" opacity=".08"/>`;
	return s;
}

/** Ornamental grass: a fan of curved blades. */
export function grass(
	r: Rand,
	cx: number,
	cy: number,
	h: number,
	color = '#9aa35a',
	tip = '#d2c68a'
): string {
	let s = `<ellipse cx="${f(cx)}" cy="${f(cy)}" rx="${f(h * 0.35)}" ry="${f(h * 0.07)}" fill="url(#shadow)"/>`;
	for (let i = 0; i < 22; i++) {
		const a = between(r, -1.1, 1.1);
		const len = h * between(r, 0.7, 1.1);
		const ex = cx + Math.sin(a) * len * 0.8;
		const ey = cy - Math.cos(a) * len;
		const mx = cx + Math.sin(a) * len * 0.2;
		const my = cy - len * 0.6;
		s += `<path d="M${f(cx + between(r, -6, 6))},${f(cy)} Q${f(mx)},${f(my)} ${f(ex)},${f(ey)}" stroke="${r() > 0.7 ? tip : color}" stroke-width="${f(between(r, 2, 4))}" fill="none" stroke-linecap="round"/>`;
	}
	return s;
}

/** Perennial flowers: a mound of green with dots of colour. */
export function perennial(r: Rand, cx: number, cy: number, size: number, bloom: string): string {
	let s = shrub(r, cx, cy, size, ['#58733f', '#4c6637', '#6a8548']);
	for (let i = 0; i < 26; i++) {
		const a = r() * Math.PI;
		const k = r() * size * 0.9;
		s += `<circle cx="${f(cx + Math.cos(a) * k * 1.1)}" cy="${f(cy - Math.sin(a) * k * 0.9 - size * 0.1)}" r="${f(size * 0.07 + 2)}" fill="${bloom}"/>`;
	}
	return s;
}

/** Ripples on open water. */
export function ripples(r: Rand, cx: number, cy: number, rx: number, ry: number, n = 6): string {
	let s = '';
	for (let i = 0; i < n; i++) {
		const x = cx + between(r, -0.6, 0.6) * rx;
		const y = cy + between(r, -0.5, 0.5) * ry;
		const w = between(r, 30, 90);
		s += `<ellipse cx="${f(x)}" cy="${f(y)}" rx="${f(w)}" ry="${f(w * 0.18)}" fill="none" stroke="#e8f4f4" stroke-opacity=".35" stroke-width="2"/>`;
	}
	return s;
}

/** A low stone-block wall with a cap, seen from the front. */
export function blockWall(
	r: Rand,
	x: number,
	y: number,
	w: number,
	h: number,
	colors = ['#a89c88', '#9a8f7c', '#b5aa95', '#8f8573']
): string {
	let s = `<rect x="${x}" y="${y}" width="${w}" height="${h}" fill="#6f675a"/>`;
	const rows = Math.max(2, Math.round(h / 44));
	const rh = h / rows;
	for (let i = 0; i < rows; i++) {
		let cx = x - (i % 2) * 40;
		while (cx < x + w) {
			const bw = between(r, 70, 130);
			const x0 = Math.max(x, cx);
			const x1 = Math.min(x + w, cx + bw);
			if (x1 - x0 > 4) {
				s += `<rect x="${f(x0 + 2)}" y="${f(y + i * rh + 2)}" width="${f(x1 - x0 - 4)}" height="${f(rh - 4)}" rx="3" fill="${pick(r, colors)}"/>`;
			}
			cx += bw;
		}
	}
	s += `<rect x="${x - 10}" y="${y - 22}" width="${w + 20}" height="26" rx="4" fill="#c9c0ae"/>`;
	s += `<rect x="${x - 10}" y="${y}" width="${w + 20}" height="5" fill="#000" opacity=".2"/>`;
	s += `<rect x="${x}" y="${y}" width="${w}" height="${h}" fill="url(#wallShade)" opacity=".5"/>`;
	return s;
}

/** A small low-voltage fixture; at dusk its glow is drawn by `glows`. */
export function fixture(x: number, y: number, scale = 1): string {
	return `<rect x="${f(x - 5 * scale)}" y="${f(y - 24 * scale)}" width="${f(10 * scale)}" height="${f(24 * scale)}" rx="2" fill="#2d2a26"/>
<rect x="${f(x - 8 * scale)}" y="${f(y - 30 * scale)}" width="${f(16 * scale)}" height="${f(9 * scale)}" rx="3" fill="#3a352f"/>`;
}

export interface Glow {
	x: number;
	y: number;
	r: number;
}

/** Dusk: darken the scene and add warm pools of light. */
export function dusk(glows: Glow[]): string {
	let s = `<rect width="${W}" height="${H}" fill="#0f1a2c" opacity=".55"/>`;
	for (const g of glows) {
		s += `<ellipse cx="${f(g.x)}" cy="${f(g.y)}" rx="${f(g.r)}" ry="${f(g.r * 0.8)}" fill="url(#glow)"/>`;
	}
	return s;
}

/** Wrap a scene into a full SVG document, optionally zoomed on a point. */
export function svg(
	body: string,
	zoom?: { x: number; y: number; k: number },
	extraDefs = ''
): string {
	// Keep the zoomed window inside the drawing, so no edge of the canvas shows.
	const clamp = (v: number, half: number, max: number) => Math.min(max - half, Math.max(half, v));
	const t = zoom
		? `translate(${f(W / 2 - clamp(zoom.x, W / 2 / zoom.k, W) * zoom.k)},${f(H / 2 - clamp(zoom.y, H / 2 / zoom.k, H) * zoom.k)}) scale(${zoom.k})`
		: '';
	return `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">${defs(
		`<linearGradient id="wallLight" x1="0" y1="0" x2="1" y2="1"><stop offset="0" stop-color="#fff" stop-opacity=".25"/><stop offset="1" stop-color="#000" stop-opacity=".2"/></linearGradient>
<linearGradient id="wallShade" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="#000" stop-opacity="0"/><stop offset="1" stop-color="#000" stop-opacity=".45"/></linearGradient>` +
			extraDefs
	)}<rect width="${W}" height="${H}" fill="#777"/><g transform="${t}">${body}</g></svg>`;
}
