/**
 * One drawn scene per demo project. Each returns the SVG body for a time of day plus the
 * points where its lights glow at dusk. All invented; nothing is traced from anywhere.
 */
import {
	W,
	H,
	between,
	blobPath,
	bubbler,
	dusk,
	fence,
	fixture,
	grass,
	gravel,
	gravelAlong,
	ground,
	hedge,
	houseWall,
	perennial,
	pick,
	ribbon,
	ripples,
	rng,
	shrub,
	sky,
	stone,
	treeLine,
	type Glow,
	type Time
} from './draw';

export interface Scene {
	draw: (time: Time) => string;
}

const greens = ['#4f6b3a', '#5d7b42', '#46613a', '#6b8a4a'];
const river = ['#8d8579', '#a39a8b', '#7a7368', '#b8ae9c', '#6d665d', '#c4baa6'];
const slateGrey = ['#4d565b', '#5c666b', '#434b50', '#6a7377'];

function withDusk(time: Time, body: string, glows: Glow[], lit: string): string {
	return time === 'dusk' ? body + dusk(glows) + lit : body;
}

const beam = (x: number, y: number, w: number, h: number) =>
	`<path d="M${x - 6},${y} L${x - w / 2},${y - h} L${x + w / 2},${y - h} L${x + 6},${y} Z" fill="#ffd58f" opacity=".12"/>`;

export const scenes: Record<string, Scene> = {
	'slate-spillway': {
		draw(time) {
			const r = rng(11);
			const hz = 430;
			let s = sky(time, hz) + treeLine(r, hz - 80) + hedge(r, hz - 140, hz + 30) + ground(hz + 20);
			s += gravel(r, 800, 820, 420, 150, river, 900, 13, '#6f685e');
			s += `<ellipse cx="800" cy="800" rx="250" ry="70" fill="url(#waterV)" opacity=".35"/>`;
			// stacked slab plinth
			for (let i = 0; i < 7; i++) {
				const y = 720 - i * 34;
				s += `<path d="${blobPath(r, 800 + between(r, -12, 12), y, 170 - i * 6, 22, 0.05, 12, 0.1)}" fill="${pick(r, slateGrey)}"/>`;
				s += `<path d="${blobPath(r, 800, y, 170 - i * 6, 22, 0.05, 12, 0.1)}" fill="url(#shade)"/>`;
			}
			// spillway lip and water sheet
			s += `<path d="M720,508 L880,508 L900,530 L700,530 Z" fill="#3b4246"/>`;
			s += `<path d="M705,528 L895,528 C893,620 885,700 880,772 L720,772 C715,700 707,620 705,528 Z" fill="url(#sheet)"/>`;
			for (let i = 0; i < 16; i++) {
				const x = 712 + i * 11.5;
				s += `<path d="M${x},532 C${x - 2},640 ${x + 3},700 ${x + between(r, -3, 3)},770" stroke="#ffffff" stroke-opacity="${between(r, 0.15, 0.45).toFixed(2)}" stroke-width="2" fill="none"/>`;
			}
			s += `<ellipse cx="800" cy="778" rx="120" ry="18" fill="#e6f4f5" opacity=".7"/>`;
			s += ripples(r, 800, 800, 220, 40, 7);
			s += grass(r, 360, 830, 220) + grass(r, 1250, 850, 240) + grass(r, 1450, 760, 160);
			s += shrub(r, 180, 760, 90, greens) + perennial(r, 1120, 740, 70, '#b6a3d6');
			s += fixture(560, 860) + fixture(1050, 880);
			const glows = [
				{ x: 800, y: 620, r: 300 },
				{ x: 560, y: 820, r: 120 },
				{ x: 1050, y: 840, r: 120 }
			];
			return withDusk(time, s, glows, beam(560, 840, 260, 300) + beam(1050, 860, 260, 320));
		}
	},

	'granite-boulder-trio': {
		draw(time) {
			const r = rng(23);
			const hz = 420;
			let s = sky(time, hz) + treeLine(r, hz - 60) + fence(r, hz - 170, hz + 40) + ground(hz + 30);
			s += gravel(r, 800, 800, 560, 190, river, 1100, 12, '#6f685e');
			const granite = { color: '#9a958c', speckle: '#3d3a36', flat: 0.2 };
			const boulders: [number, number, number, number][] = [
				[560, 700, 120, 150],
				[820, 660, 150, 200],
				[1080, 730, 110, 120]
			];
			for (const [x, y, rx, ry] of boulders) {
				s += stone(r, x, y, rx, ry, granite);
				s += `<ellipse cx="${x}" cy="${y - ry * 0.62}" rx="14" ry="5" fill="#2f3b3d"/>`;
				s += bubbler(x, y - ry * 0.62, 28 + ry * 0.08, 16);
				s += `<path d="M${x - 10},${y - ry * 0.6} Q${x - rx * 0.5},${y - ry * 0.1} ${x - rx * 0.7},${y + ry * 0.3}" stroke="#5a6e72" stroke-width="10" stroke-opacity=".45" fill="none"/>`;
			}
			s += grass(r, 300, 830, 200) + grass(r, 1330, 820, 230);
			s += perennial(r, 160, 700, 80, '#e0b84f') + shrub(r, 1480, 690, 100, greens);
			s +=
				stone(r, 420, 900, 60, 30, { color: '#8a847a' }) +
				stone(r, 1210, 920, 70, 32, { color: '#8a847a' });
			s += fixture(660, 900) + fixture(950, 910) + fixture(1180, 860);
			const glows = boulders.map(([x, y, rx]) => ({ x, y: y - 20, r: rx * 1.5 }));
			return withDusk(time, s, glows, beam(660, 880, 200, 260) + beam(950, 890, 220, 300));
		}
	},

	'hillside-pondless-stream': {
		draw(time) {
			const r = rng(37);
			const hz = 300;
			let s =
				sky(time, hz) +
				treeLine(r, hz - 20, ['#3f5636', '#4d6440', '#34492d']) +
				ground(hz - 10, '#6a8546', '#86a05c');
			s += `<path d="M0,${hz} C500,${hz + 40} 900,${hz + 160} ${W},${hz + 420} L${W},${H} L0,${H} Z" fill="#6f8a48"/>`;
			s += `<path d="M0,${hz + 120} C600,${hz + 200} 1100,${hz + 420} ${W},${hz + 640} L${W},${H} L0,${H} Z" fill="#5d7a3e"/>`;
			const path: [number, number][] = [
				[300, 330],
				[420, 420],
				[560, 470],
				[640, 560],
				[820, 640],
				[900, 740],
				[1100, 820],
				[1260, 950],
				[1400, 1060]
			];
			const wd = (t: number) => 30 + t * 110;
			s += `<path d="${ribbon(path, (t) => wd(t) + 40)}" fill="#6d665d"/>`;
			s += gravelAlong(r, path, (t) => wd(t) + 40, river, 40, 14);
			s += `<path d="${ribbon(path, wd)}" fill="url(#waterV)"/>`;
			for (let i = 1; i < path.length - 1; i += 2) {
				const [x, y] = path[i];
				const w = wd(i / (path.length - 1));
				s += `<path d="M${x - w * 0.8},${y} Q${x},${y + 24} ${x + w * 0.8},${y}" stroke="#eef8f8" stroke-width="${5 + i}" stroke-opacity=".7" fill="none"/>`;
				s += `<ellipse cx="${x}" cy="${y + 18}" rx="${w * 0.7}" ry="${6 + i}" fill="#e6f4f5" opacity=".5"/>`;
			}
			for (let i = 0; i < path.length; i++) {
				const [x, y] = path[i];
				const w = wd(i / (path.length - 1)) + 50;
				const k = 0.5 + i * 0.12;
				s += stone(r, x - w, y + 10, 60 * k, 40 * k, {
					color: pick(r, ['#8f877a', '#a0978a', '#7d766b'])
				});
				s += stone(r, x + w, y + 20, 70 * k, 44 * k, {
					color: pick(r, ['#8f877a', '#a0978a', '#7d766b'])
				});
			}
			s +=
				shrub(r, 180, 520, 90, greens) +
				grass(r, 1000, 560, 200) +
				perennial(r, 420, 700, 90, '#c65b4a');
			s +=
				grass(r, 300, 960, 260) +
				perennial(r, 1450, 720, 80, '#e0b84f') +
				shrub(r, 700, 930, 110, greens);
			return withDusk(time, s, [{ x: 900, y: 740, r: 260 }], '');
		}
	},

	'wildlife-pond': {
		draw(time) {
			const r = rng(41);
			const hz = 380;
			let s =
				sky(time, hz) +
				treeLine(r, hz, ['#3a5233', '#4a6340', '#2f4429', '#566f45']) +
				ground(hz - 10, '#58743a', '#7f9653');
			s += `<path d="${blobPath(r, 800, 720, 640, 230, 0.08, 12, 0.1)}" fill="#6d665d"/>`;
			s += `<path d="${blobPath(r, 800, 720, 590, 200, 0.06, 12, 0.1)}" fill="url(#waterV)"/>`;
			s += `<path d="${blobPath(r, 800, 700, 500, 140, 0.06, 12, 0.1)}" fill="#2b5660" opacity=".35"/>`;
			s += ripples(r, 800, 720, 420, 120, 9);
			// reflections of trees
			s += `<path d="M350,560 Q800,520 1250,570 L1200,620 Q800,600 400,615 Z" fill="#2d4a33" opacity=".35"/>`;
			// lily pads
			for (let i = 0; i < 9; i++) {
				const x = between(r, 900, 1250);
				const y = between(r, 690, 850);
				const w = between(r, 22, 40);
				s += `<path d="M${x},${y} m${w},0 a${w},${w * 0.4} 0 1,1 -${w * 0.3},-${w * 0.36} L${x},${y} Z" fill="#4c7a3c"/>`;
				if (r() > 0.6) s += `<circle cx="${x}" cy="${y - 6}" r="7" fill="#f1e6f0"/>`;
			}
			// pebble beach on the left
			s += gravel(r, 330, 790, 200, 80, river, 360, 11, '#847c6f');
			// reeds and marginal planting
			for (let i = 0; i < 5; i++) {
				s += grass(r, 1180 + i * 60, 560 + i * 8, 180, '#5f7d3c', '#7e6a3c');
			}
			s += shrub(r, 190, 560, 120, greens) + perennial(r, 1480, 760, 90, '#9c6fb4');
			s += perennial(r, 1350, 940, 100, '#e0b84f') + grass(r, 520, 980, 200);
			s +=
				stone(r, 600, 940, 90, 40, { color: '#857d70' }) +
				stone(r, 1060, 960, 120, 46, { color: '#7a7367' });
			// a log for frogs and birds
			s += `<rect x="420" y="600" width="220" height="34" rx="16" fill="#6b5440" transform="rotate(-8 530 617)"/>`;
			return withDusk(time, s, [{ x: 800, y: 700, r: 200 }], '');
		}
	},

	'courtyard-wall-spout': {
		draw(time) {
			const r = rng(53);
			const hz = 760;
			let s = houseWall(0, hz, '#d6c7ae');
			// stone veneer panel
			for (let y = 120; y < hz - 20; y += 52) {
				for (let x = 460 + ((y / 52) % 2) * 30; x < 1140; x += between(r, 70, 120)) {
					s += `<rect x="${x}" y="${y}" width="${between(r, 60, 110)}" height="46" rx="6" fill="${pick(r, ['#a99880', '#9b8b74', '#b6a68d', '#8d7f6a'])}"/>`;
				}
			}
			s += `<rect x="440" y="100" width="720" height="${hz - 100}" fill="url(#wallLight)"/>`;
			s += `<rect x="0" y="${hz}" width="${W}" height="${H - hz}" fill="#b9ad98"/>`;
			// paving joints
			for (let x = -200; x < W + 200; x += 180) {
				s += `<line x1="${x}" y1="${hz}" x2="${x + (x - 800) * 0.6}" y2="${H}" stroke="#8f8470" stroke-width="3"/>`;
			}
			for (let y = hz + 60; y < H; y += 90) {
				s += `<line x1="0" y1="${y}" x2="${W}" y2="${y}" stroke="#8f8470" stroke-width="3"/>`;
			}
			// trough basin
			s += `<rect x="520" y="620" width="560" height="190" rx="10" fill="#7d766b"/>`;
			s += `<rect x="540" y="630" width="520" height="40" rx="8" fill="url(#waterV)"/>`;
			s += `<rect x="520" y="620" width="560" height="190" rx="10" fill="url(#shade)"/>`;
			// copper spout and arc of water
			s += `<rect x="770" y="300" width="60" height="34" rx="6" fill="#9c5a2e"/><rect x="790" y="310" width="80" height="16" rx="6" fill="#b8703e"/>`;
			s += `<path d="M866,318 C930,330 960,460 960,648" stroke="#d8eef0" stroke-width="16" fill="none" opacity=".85"/>`;
			s += `<path d="M872,318 C930,336 950,460 952,648" stroke="#fff" stroke-width="3" fill="none" opacity=".6"/>`;
			s += `<ellipse cx="958" cy="650" rx="50" ry="10" fill="#eef8f8" opacity=".8"/>`;
			s += ripples(r, 800, 650, 230, 12, 4);
			// pots
			for (const [x, c] of [
				[300, '#a5562d'],
				[1300, '#5a6a72']
			] as const) {
				s += `<path d="M${x - 80},700 L${x + 80},700 L${x + 60},900 L${x - 60},900 Z" fill="${c}"/>`;
				s += `<path d="M${x - 80},700 L${x + 80},700 L${x + 60},900 L${x - 60},900 Z" fill="url(#shade)"/>`;
				s += shrub(r, x, 690, 110, greens) + grass(r, x, 660, 160, '#7f9a4c');
			}
			s += `<ellipse cx="800" cy="820" rx="320" ry="24" fill="url(#shadow)"/>`;
			return withDusk(time, s, [{ x: 800, y: 420, r: 380 }], beam(800, 640, 500, 560));
		}
	},

	'lit-terrace-seat-wall': {
		draw(time) {
			const r = rng(67);
			const hz = 400;
			let s =
				sky(time, hz) +
				treeLine(r, hz - 40) +
				hedge(r, hz - 120, hz + 40, ['#34502d', '#40603a', '#2f4829']) +
				ground(hz + 30, '#627f40', '#88a05a');
			// terrace of flagstones in perspective
			s += `<path d="M100,${H} L420,560 L1180,560 L1500,${H} Z" fill="#6e665a"/>`;
			for (let row = 0; row < 9; row++) {
				const t0 = row / 9;
				const t1 = (row + 1) / 9;
				const y0 = 560 + (H - 560) * t0 * t0;
				const y1 = 560 + (H - 560) * t1 * t1;
				const l0 = 420 - 320 * t0 * t0;
				const r0 = 1180 + 320 * t0 * t0;
				let x = l0;
				while (x < r0 - 10) {
					const w = between(r, 80, 170) * (0.7 + t0);
					const x2 = Math.min(r0, x + w);
					s += `<rect x="${x + 4}" y="${y0 + 3}" width="${Math.max(4, x2 - x - 8)}" height="${Math.max(4, y1 - y0 - 6)}" rx="4" fill="${pick(r, ['#b9a98c', '#c7b89b', '#a99a7e', '#d0c2a5'])}"/>`;
					x = x2;
				}
			}
			// curved seat wall behind the terrace
			s += `<path d="M260,600 Q800,470 1340,600 L1340,500 Q800,370 260,500 Z" fill="#9a8f7c"/>`;
			for (let i = 0; i < 3; i++) {
				const y = 500 + i * 34;
				s += `<path d="M260,${y} Q800,${y - 130} 1340,${y}" stroke="#6f675a" stroke-width="3" fill="none"/>`;
			}
			for (let x = 300; x < 1320; x += 70) {
				s += `<line x1="${x}" y1="${470 + Math.abs(x - 800) * 0.25 - 80}" x2="${x}" y2="${560 + Math.abs(x - 800) * 0.25 - 70}" stroke="#6f675a" stroke-width="2" opacity=".6"/>`;
			}
			s += `<path d="M240,505 Q800,365 1360,505 L1360,478 Q800,338 240,478 Z" fill="#cfc5b1"/>`;
			s += `<path d="M260,600 Q800,470 1340,600 L1340,500 Q800,370 260,500 Z" fill="url(#wallShade)" opacity=".45"/>`;
			// chairs and a planter
			s += `<rect x="640" y="690" width="120" height="80" rx="10" fill="#41525a"/><rect x="630" y="640" width="140" height="60" rx="10" fill="#4e626b"/>`;
			s += `<rect x="880" y="700" width="120" height="80" rx="10" fill="#41525a"/><rect x="870" y="650" width="140" height="60" rx="10" fill="#4e626b"/>`;
			s +=
				perennial(r, 140, 780, 100, '#d8a24a') +
				grass(r, 1470, 800, 240) +
				shrub(r, 1500, 560, 90, greens);
			const capLights = [360, 560, 800, 1040, 1240];
			const glows = capLights.map((x) => ({
				x,
				y: 560 - (260 - Math.abs(x - 800) * 0.25) * 0.35,
				r: 130
			}));
			for (const g of glows) {
				s += `<rect x="${g.x - 14}" y="${g.y - 40}" width="28" height="8" rx="3" fill="#2d2a26"/>`;
			}
			return withDusk(
				time,
				s,
				[...glows, { x: 800, y: 800, r: 360 }],
				glows
					.map((g) => `<ellipse cx="${g.x}" cy="${g.y - 20}" rx="60" ry="26" fill="url(#glow)"/>`)
					.join('')
			);
		}
	},

	'flagstone-garden-path': {
		draw(time) {
			const r = rng(79);
			const hz = 360;
			let s =
				sky(time, hz) +
				treeLine(r, hz - 20) +
				fence(r, hz - 150, hz + 40, '#7a6a58') +
				ground(hz + 30, '#56703a', '#7d9552');
			const pts: [number, number][] = [
				[760, 420],
				[720, 520],
				[820, 640],
				[760, 780],
				[880, 920],
				[820, 1080]
			];
			s += `<path d="${ribbon(pts, (t) => 50 + t * 260)}" fill="#7c8f52"/>`;
			// flagstones along the path, larger in front
			for (let i = 0; i < 26; i++) {
				const t = i / 25;
				const seg = Math.min(pts.length - 2, Math.floor(t * (pts.length - 1)));
				const u = t * (pts.length - 1) - seg;
				const x =
					pts[seg][0] + (pts[seg + 1][0] - pts[seg][0]) * u + between(r, -1, 1) * (30 + t * 120);
				const y = pts[seg][1] + (pts[seg + 1][1] - pts[seg][1]) * u;
				const w = 30 + t * 120;
				s += `<path d="${blobPath(r, x, y, w, w * 0.38, 0.22, 7, 0.05)}" fill="${pick(r, ['#b3a58b', '#a1937a', '#c2b59b', '#9c8f77'])}"/>`;
				s += `<path d="${blobPath(r, x, y, w, w * 0.38, 0.22, 7, 0.05)}" fill="url(#shade)" opacity=".6"/>`;
			}
			// creeping thyme flowers in the joints
			for (let i = 0; i < 220; i++) {
				const y = between(r, 440, 1060);
				const t = (y - 420) / 660;
				const x = 790 + between(r, -1, 1) * (60 + t * 240);
				s += `<circle cx="${x.toFixed(1)}" cy="${y.toFixed(1)}" r="${(2 + t * 4).toFixed(1)}" fill="${pick(r, ['#b58ac6', '#9b6fb0', '#6f8a45'])}" opacity=".8"/>`;
			}
			// beds either side
			const blooms = ['#d9b44a', '#c65b4a', '#b6a3d6', '#e8e1d0', '#d98b5f'];
			for (let i = 0; i < 7; i++) {
				const y = 470 + i * 90;
				const k = 0.5 + i * 0.18;
				s += perennial(r, 520 - i * 60, y, 60 * k, pick(r, blooms));
				s += perennial(r, 1080 + i * 60, y + 20, 60 * k, pick(r, blooms));
				if (i % 2) {
					s += grass(r, 330 - i * 30, y + 30, 120 * k) + grass(r, 1300 + i * 30, y + 30, 120 * k);
				}
			}
			return withDusk(time, s, [{ x: 800, y: 700, r: 200 }], '');
		}
	},

	'dry-creek-downspout': {
		draw(time) {
			const r = rng(97);
			const hz = 520;
			let s = houseWall(0, hz, '#c9c2b4');
			for (let y = 20; y < hz; y += 28) {
				s += `<line x1="0" y1="${y}" x2="520" y2="${y}" stroke="#a79f90" stroke-width="2"/>`;
			}
			s +=
				`<rect x="520" y="0" width="${W - 520}" height="${hz}" fill="#c9dde3"/>` +
				treeLine(r, hz, ['#4d6440', '#3f5636']).replace(/<path/g, '<path clip-path="url(#right)"');
			s += `<clipPath id="right"><rect x="520" y="0" width="${W}" height="${hz}"/></clipPath>`;
			s += `<rect x="505" y="0" width="30" height="${hz}" fill="#b3ab9c"/>`;
			s += ground(hz, '#5a763b', '#829a55');
			// downspout
			s += `<rect x="380" y="0" width="34" height="${hz + 10}" fill="#8c8f8c"/><path d="M380,${hz} L414,${hz} L440,${hz + 50} L396,${hz + 60} Z" fill="#7a7d7a"/>`;
			const path: [number, number][] = [
				[420, 600],
				[520, 660],
				[760, 700],
				[900, 780],
				[1080, 860],
				[1300, 930],
				[1620, 1000]
			];
			const wd = (t: number) => 70 + t * 140;
			s += `<path d="${ribbon(path, wd)}" fill="#6d665d"/>`;
			s += gravelAlong(r, path, wd, river, 140, 16);
			for (let i = 0; i < path.length; i++) {
				const [x, y] = path[i];
				const w = wd(i / (path.length - 1));
				if (i % 2 === 0) {
					s += stone(r, x - w * 0.9, y + 10, 50 + i * 10, 30 + i * 6, {
						color: pick(r, ['#8f877a', '#a0978a', '#7d766b'])
					});
				} else {
					s += stone(r, x + w * 0.9, y + 20, 60 + i * 10, 34 + i * 6, {
						color: pick(r, ['#8f877a', '#a0978a', '#7d766b'])
					});
				}
			}
			// a flat bridge stone
			s += `<path d="${blobPath(r, 900, 780, 160, 40, 0.08, 9, 0.05)}" fill="#b3a58b"/><path d="${blobPath(r, 900, 780, 160, 40, 0.08, 9, 0.05)}" fill="url(#shade)"/>`;
			s += grass(r, 640, 820, 200) + grass(r, 1220, 760, 220) + grass(r, 1480, 1030, 220);
			s +=
				perennial(r, 240, 760, 100, '#d9b44a') +
				shrub(r, 1080, 620, 100, greens) +
				perennial(r, 700, 1000, 110, '#c65b4a');
			return withDusk(time, s, [{ x: 900, y: 780, r: 220 }], '');
		}
	},

	'basalt-column-trio': {
		draw(time) {
			const r = rng(131);
			const hz = 440;
			let s =
				sky(time, hz) +
				treeLine(r, hz - 60, ['#34492d', '#3f5636', '#2d4027']) +
				hedge(r, hz - 120, hz + 30, ['#2f4a2a', '#3a5733', '#2a4226']) +
				ground(hz + 20, '#55703a', '#7a9150');
			s += gravel(
				r,
				800,
				840,
				520,
				170,
				['#3e4347', '#4c5257', '#5a6064', '#34393c'],
				1000,
				11,
				'#2f3437'
			);
			const cols: [number, number, number][] = [
				[620, 330, 70],
				[800, 250, 80],
				[970, 390, 66]
			];
			for (const [x, h, w] of cols) {
				const top = 820 - h - 200;
				s += `<ellipse cx="${x + 20}" cy="820" rx="${w * 1.5}" ry="24" fill="url(#shadow)"/>`;
				s += `<path d="M${x - w},${top + 20} L${x - w * 0.4},${top} L${x + w * 0.5},${top + 4} L${x + w},${top + 24} L${x + w},820 L${x - w},820 Z" fill="#3c4246"/>`;
				s += `<path d="M${x - w * 0.4},${top + 8} L${x - w * 0.4},820 L${x + w * 0.5},820 L${x + w * 0.5},${top + 10} Z" fill="#4a5156"/>`;
				s += `<path d="M${x - w},${top + 20} L${x - w * 0.4},${top} L${x + w * 0.5},${top + 4} L${x + w},${top + 24} L${x + w * 0.4},${top + 36} L${x - w * 0.5},${top + 34} Z" fill="#59626a"/>`;
				s += `<path d="M${x - w * 0.9},${top + 26} L${x - w * 0.85},820" stroke="#8fb7bd" stroke-width="8" stroke-opacity=".45"/>`;
				s += `<path d="M${x + w * 0.9},${top + 30} L${x + w * 0.9},820" stroke="#8fb7bd" stroke-width="8" stroke-opacity=".35"/>`;
				s += bubbler(x, top + 20, 24, 14);
			}
			s +=
				grass(r, 320, 860, 240, '#8f9a55') +
				grass(r, 1290, 860, 260, '#8f9a55') +
				shrub(r, 160, 720, 100, greens) +
				perennial(r, 1470, 740, 80, '#e8e1d0');
			s += fixture(720, 950) + fixture(900, 960);
			const glows = cols.map(([x, h]) => ({ x, y: 820 - h / 2 - 100, r: 160 }));
			return withDusk(time, s, glows, beam(720, 930, 240, 460) + beam(900, 940, 220, 420));
		}
	}
};

export { H, W };
