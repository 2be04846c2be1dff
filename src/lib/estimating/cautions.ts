/** The cautions an estimate carries, each with its reason and a reference. */
export interface Caution {
	id: string;
	title: string;
	reason: string;
	reference: string;
}

export interface CautionFacts {
	digs: boolean;
	hasPump: boolean;
	hasLighting: boolean;
	stonesNeedingHelp: string[];
	/** A loader or excavator works on site. */
	machines?: boolean;
	wallsNeedingPermit: string[];
	wallsNeedingEngineering: string[];
	openWaterDepthM: number;
	/** Where the deepest open water is ("The basin", a pond's name); "The basin" when not given. */
	openWaterWhere?: string;
	openWaterLimitM: number;
}

const LOCATE: Caution = {
	id: 'locate-utilities',
	title: 'Locate buried utilities before digging',
	reason:
		'Basins, trenches for pipe and cable, and wall footings cut into ground that may hide gas, power, water and communication lines.',
	reference:
		'In the US call 811 (or use the state one-call center online) and wait the period the state sets before digging, commonly two to three working days (from memory); elsewhere, the local locating service.'
};

const GROUND_FAULT: Caution = {
	id: 'ground-fault-protection',
	title: 'Ground-fault protection for pumps and lights near water',
	reason:
		'A pump sits in the water and lights stand beside it: the circuit feeding them needs ground-fault protection and outdoor, wet-location rated receptacles and covers.',
	reference:
		'NEC (NFPA 70) Article 680 Part V, fountains, and 210.8 on GFCI protection outdoors; Article 411 for low-voltage lighting systems.'
};

const ELECTRICIAN: Caution = {
	id: 'licensed-electrician',
	title: 'Mains wiring by a licensed electrician',
	reason:
		'New circuits, receptacles and the supply to the pump or transformer are line-voltage work; the low-voltage side beyond a listed transformer is the installer’s.',
	reference: 'NEC (NFPA 70) and the state or local electrical licensing rules.'
};

const MACHINES: Caution = {
	id: 'machines',
	title: 'Machines on site',
	reason:
		'A loader or excavator works here: only a trained operator runs it, everyone else stays out of its swing and travel path, the ground it crosses and the edges of the hole are checked first, and a suspended stone is never stood under.',
	reference:
		'The machine maker’s operating manual; OSHA 29 CFR 1926 Subpart P for excavations (in the US); local rules.'
};

const LOCAL_CODES: Caution = {
	id: 'local-codes',
	title: 'Local codes and licensed practice come first',
	reason:
		'These figures are estimates for planning. Local codes, the authority having jurisdiction and licensed professionals have the final word on permits, electrical work, structures and safety.',
	reference: 'The building, electrical and plumbing codes adopted where the work is done.'
};

function heavyLifting(stones: string[]): Caution {
	return {
		id: 'heavy-lifting',
		title: 'Heavy stones: lift safely',
		reason: `${stones.join(', ')} weigh more than one person should lift: use the team, cart, hoist or loader the plan gives, keep the load close, lift with the legs and keep clear of a suspended stone.`,
		reference:
			'NIOSH Revised Lifting Equation, publication 94-110 (load constant 23 kg / 51 lb under ideal conditions).'
	};
}

function wallHeight(permit: string[], engineering: string[]): Caution {
	const names = [...new Set([...permit, ...engineering])].join(', ');
	return {
		id: 'wall-height',
		title: 'Retaining wall height: permit or engineered design',
		reason: `${names} ${engineering.length ? 'retains more unbalanced fill than the code allows without an engineered design' : 'is tall enough from the bottom of its footing to need a permit'}; confirm the local limits before building.`,
		reference:
			'IRC R404.4: retaining walls over 48 in (1219 mm) of unbalanced fill, or over 24 in resisting a surcharge, need a design by accepted engineering practice; IRC R105.2 (and IBC 105.2): walls over 4 ft from the bottom of the footing, or supporting a surcharge, need a permit.'
	};
}

function openWater(depthM: number, limitM: number, where = 'The basin'): Caution {
	const barrier =
		depthM > limitM
			? ' It is deep enough that codes commonly want a barrier around it.'
			: where === 'The basin'
				? ' Consider a gravel-filled basin or a grate.'
				: ' Consider a shallow shelf all round and a safety grid or a fence.';
	return {
		id: 'open-water',
		title: 'Open water and children',
		reason: `${where} holds about ${(depthM / 0.0254).toFixed(0)} in of open water, and small children can drown in a few inches.${barrier} Supervise children near it.`,
		reference:
			'CPSC "Safety Barrier Guidelines for Residential Pools" (publication 362); ISPSC section 305 barriers for water over 24 in deep (from memory); local code.'
	};
}

export function cautionsFor(facts: CautionFacts): Caution[] {
	const list: Caution[] = [];
	if (facts.digs) list.push(LOCATE);
	if (facts.hasPump || facts.hasLighting) list.push(GROUND_FAULT, ELECTRICIAN);
	if (facts.stonesNeedingHelp.length) list.push(heavyLifting(facts.stonesNeedingHelp));
	if (facts.machines) list.push(MACHINES);
	if (facts.wallsNeedingPermit.length || facts.wallsNeedingEngineering.length) {
		list.push(wallHeight(facts.wallsNeedingPermit, facts.wallsNeedingEngineering));
	}
	if (facts.openWaterDepthM > 0) {
		list.push(openWater(facts.openWaterDepthM, facts.openWaterLimitM, facts.openWaterWhere));
	}
	list.push(LOCAL_CODES);
	return list;
}
