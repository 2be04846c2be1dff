// A season's proposed schedule: the undated visits put in crew days as nearest-neighbour routes
// from the yard (the pure planner in $lib/care/route), and the owner's moves, which re-route both
// days.
import { and, eq, ne, sql } from 'drizzle-orm';
import { db } from '../platform/db';
import { careCrewDays, propertyLocations, serviceVisits } from '../platform/db/schema';
import { firmSettings } from '../platform/settings';
import { nearestNeighbourOrder, planSeason, type PlanStop } from '$lib/care/route';
import { CareError, dayIn, type Tx } from './db';
import { dayText } from './mail';
import { seasonSettings } from './plans';
import { seasonRange, seasonVisits } from './season';
import { crewDaysBetween } from './crew-days';

/** Straight-line to road distance (common practice, no source). */
const ROAD_FACTOR = 1.3;

async function routeOptions() {
	const s = await seasonSettings();
	if (s.depotLat === null || s.depotLng === null) {
		throw new CareError(
			'invalid',
			'Set where the crews start from (the yard) in the season settings first.'
		);
	}
	return {
		depot: { lat: s.depotLat, lng: s.depotLng },
		speedKmh: s.speedKmh,
		roadFactor: ROAD_FACTOR
	};
}

/**
 * Proposes dates for the season's visits not yet dated: crew days from today on (in the
 * window), filled by nearest-neighbour routes within each crew's hours. Dated visits keep their
 * day and take their time out of it. Visits with no place on the map stay undated.
 */
export async function proposeSchedule(
	key: string
): Promise<{ placed: number; unplaced: number; unlocated: number }> {
	const window = await seasonRange(key);
	const options = await routeOptions();
	const firm = await firmSettings();
	const from = [window.start, dayIn(firm.timeZone)].sort()[1];
	return db.transaction(async (tx) => {
		await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${'care-plan:' + key}))`);
		const rows = await seasonVisits(key, tx);
		const days = await crewDaysBetween(from, window.end, tx);
		const dated = rows.filter((r) => r.v.status === 'dated' && r.v.crewDayId);
		const busy = new Map<string, number>();
		for (const r of dated) busy.set(r.v.crewDayId!, (busy.get(r.v.crewDayId!) ?? 0) + r.v.minutes);
		const open = rows.filter((r) => r.v.status === 'due');
		const stops: PlanStop[] = open
			.filter((r) => r.lat !== null && r.lng !== null)
			.map((r) => ({
				id: r.v.id,
				lat: r.lat!,
				lng: r.lng!,
				minutes: r.v.minutes,
				windowStart: r.v.windowStart,
				windowEnd: r.v.windowEnd
			}));
		const plan = planSeason(
			stops,
			days.map(({ d }) => ({
				id: d.id,
				day: d.day,
				startMinute: d.startMinute + (busy.get(d.id) ?? 0),
				endMinute: d.endMinute
			})),
			options
		);
		const leadOf = new Map(days.map(({ d }) => [d.id, d]));
		await tx
			.update(serviceVisits)
			.set({ day: null, crewDayId: null, crewLeadId: null, routeOrder: null })
			.where(and(eq(serviceVisits.season, key), eq(serviceVisits.status, 'due')));
		const rowsToSet: {
			id: string;
			day: string;
			crew_day_id: string;
			crew_lead_id: string;
			route_order: number;
		}[] = [];
		for (const day of plan.days) {
			const crewDay = leadOf.get(day.crewDayId)!;
			const offset = dated.filter((r) => r.v.crewDayId === day.crewDayId).length;
			for (const [i, stop] of day.stops.entries()) {
				rowsToSet.push({
					id: stop.id,
					day: day.day,
					crew_day_id: day.crewDayId,
					crew_lead_id: crewDay.crewLeadId,
					route_order: offset + i + 1
				});
			}
		}
		// One statement for the whole season, however many visits it places.
		if (rowsToSet.length) {
			await tx.execute(sql`
				update service_visits as v
				set day = p.day, crew_day_id = p.crew_day_id, crew_lead_id = p.crew_lead_id,
					route_order = p.route_order, updated_at = now()
				from jsonb_to_recordset(${JSON.stringify(rowsToSet)}::jsonb)
					as p(id text, day date, crew_day_id text, crew_lead_id text, route_order int)
				where v.id = p.id`);
		}
		const placed = rowsToSet.length;
		return { placed, unplaced: plan.unplaced.length, unlocated: open.length - stops.length };
	});
}

/** Orders one crew day's visits as a nearest-neighbour route from the yard. */
async function reorderDay(tx: Tx, crewDayId: string, depot: { lat: number; lng: number }) {
	const rows = await tx
		.select({ id: serviceVisits.id, lat: propertyLocations.lat, lng: propertyLocations.lng })
		.from(serviceVisits)
		.leftJoin(propertyLocations, eq(propertyLocations.propertyId, serviceVisits.propertyId))
		.where(and(eq(serviceVisits.crewDayId, crewDayId), ne(serviceVisits.status, 'cancelled')));
	const placed = rows.filter((r) => r.lat !== null && r.lng !== null) as {
		id: string;
		lat: number;
		lng: number;
	}[];
	const order = [...nearestNeighbourOrder(depot, placed), ...rows.filter((r) => r.lat === null)];
	for (const [i, r] of order.entries()) {
		await tx
			.update(serviceVisits)
			.set({ routeOrder: i + 1 })
			.where(eq(serviceVisits.id, r.id));
	}
}

/** The owner moves a visit to another crew day (inside its window); both days are re-routed. */
export async function moveVisit(visitId: string, crewDayId: string): Promise<void> {
	const options = await routeOptions();
	await db.transaction(async (tx) => {
		const [v] = await tx
			.select()
			.from(serviceVisits)
			.where(eq(serviceVisits.id, visitId))
			.for('update');
		if (!v) throw new CareError('not_found', 'There is no such service visit.');
		if (v.status !== 'due' && v.status !== 'dated') {
			throw new CareError('invalid', 'Only a visit not yet done can move.');
		}
		const [day] = await tx.select().from(careCrewDays).where(eq(careCrewDays.id, crewDayId));
		if (!day) throw new CareError('invalid', 'Pick a crew day.');
		if (day.day < v.windowStart || day.day > v.windowEnd) {
			throw new CareError(
				'invalid',
				`${dayText(day.day)} is outside this visit's window (${dayText(v.windowStart)} to ${dayText(v.windowEnd)}).`
			);
		}
		await tx
			.update(serviceVisits)
			.set({ day: day.day, crewDayId: day.id, crewLeadId: day.crewLeadId, routeOrder: 9999 })
			.where(eq(serviceVisits.id, visitId));
		await reorderDay(tx, day.id, options.depot);
		if (v.crewDayId && v.crewDayId !== day.id) await reorderDay(tx, v.crewDayId, options.depot);
	});
}
