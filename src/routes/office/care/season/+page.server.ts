import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { seasonSettingsSchema } from '$lib/schema/care';
import { parseSeasonKey, SEASON_DEFAULTS } from '$lib/care/seasons';
import { isDate, parseClock } from '$lib/scheduling/zone';
import { requireRole } from '$lib/server/auth/access';
import { dayIn } from '$lib/server/care/db';
import { domainAction } from '$lib/server/http/domain';
import { saveSeasonSettings, seasonSettings } from '$lib/server/care/plans';
import { generateSeason, seasonBoard } from '$lib/server/care/season';
import { addCrewDays, removeCrewDay } from '$lib/server/care/crew-days';
import { moveVisit, proposeSchedule } from '$lib/server/care/season-routes';
import { sendDates } from '$lib/server/care/season-mail';
import { crewLeads } from '$lib/server/jobs/read';
import { firmSettings } from '$lib/server/platform/settings';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/platform/forms';

/** The season in the address, else the next autumn (the one that matters most before frost). */
async function seasonOf(url: URL): Promise<string> {
	const asked = url.searchParams.get('season') ?? '';
	if (parseSeasonKey(asked)) return asked;
	const firm = await firmSettings();
	const today = dayIn(firm.timeZone);
	const settings = await seasonSettings();
	const year = Number(today.slice(0, 4));
	return today.slice(5) < settings.firstFrost ? `autumn-${year}` : `autumn-${year + 1}`;
}

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner');
	const key = await seasonOf(event.url);
	const year = Number(key.slice(-4));
	const [board, settings, leads] = await Promise.all([
		seasonBoard(key),
		seasonSettings(),
		crewLeads()
	]);
	const seasons = [year - 1, year, year + 1].flatMap((y) =>
		(['spring', 'summer', 'autumn'] as const).map((s) => `${s}-${y}`)
	);
	return { key, board, settings, leads, seasons, defaults: SEASON_DEFAULTS };
};

const seasonField = z.object({
	season: z.string().refine((s) => parseSeasonKey(s) !== null, 'Pick a season')
});

function keyFrom(data: FormData) {
	const parsed = seasonField.safeParse({ season: data.get('season') });
	return parsed.success ? parsed.data.season : null;
}

const crewDaysSchema = z
	.object({
		from: z.string().refine(isDate, 'A date'),
		to: z.string().refine(isDate, 'A date'),
		crewLeadId: z.string().min(1, 'Pick a crew lead'),
		start: z.string().refine((v) => parseClock(v) !== null, 'A time like 08:00'),
		end: z.string().refine((v) => parseClock(v) !== null, 'A time like 16:00'),
		weekdaysOnly: z.string().optional()
	})
	.refine((v) => v.to >= v.from, { message: 'The last day comes after the first', path: ['to'] })
	.refine((v) => (parseClock(v.end) ?? 0) > (parseClock(v.start) ?? 0), {
		message: 'The day ends after it starts',
		path: ['end']
	});

export const actions: Actions = {
	settings: async (event) => {
		requireRole(event, 'owner');
		const parsed = await parseForm(event.request, seasonSettingsSchema, {
			extra: { form: 'settings' }
		});
		if (!parsed.ok) return parsed.failure;
		await saveSeasonSettings(parsed.data);
		return { form: 'settings', message: 'Saved.' };
	},
	generate: async (event) => {
		requireRole(event, 'owner');
		const key = keyFrom(await event.request.formData());
		if (!key) return fail(400, { form: 'generate', message: 'Pick a season' });
		const r = await generateSeason(key);
		return { form: 'generate', message: `${r.created} new visits; ${r.total} in the season.` };
	},
	crewDays: async (event) => {
		requireRole(event, 'owner');
		const parsed = await parseForm(event.request, crewDaysSchema, { extra: { form: 'crewDays' } });
		if (!parsed.ok) return parsed.failure;
		const d = parsed.data;
		const added = await domainAction(
			() =>
				addCrewDays({
					from: d.from,
					to: d.to,
					crewLeadId: d.crewLeadId,
					startMinute: parseClock(d.start)!,
					endMinute: parseClock(d.end)!,
					weekdaysOnly: d.weekdaysOnly === 'on'
				}),
			'crewDays'
		);
		if (typeof added !== 'number') return added;
		return { form: 'crewDays', message: `${added} crew days added.` };
	},
	removeDay: async (event) => {
		requireRole(event, 'owner');
		const id = String((await event.request.formData()).get('crewDayId') ?? '');
		if (!id) return fail(400, { form: 'removeDay', message: 'Pick a crew day' });
		await removeCrewDay(id);
		return { form: 'removeDay', message: 'Crew day removed; its visits are undated again.' };
	},
	propose: async (event) => {
		requireRole(event, 'owner');
		const key = keyFrom(await event.request.formData());
		if (!key) return fail(400, { form: 'propose', message: 'Pick a season' });
		const r = await domainAction(() => proposeSchedule(key), 'propose');
		if (!('placed' in r)) return r;
		return {
			form: 'propose',
			message: `${r.placed} visits placed; ${r.unplaced} did not fit the crew days${r.unlocated ? `; ${r.unlocated} have no place on the map yet` : ''}.`
		};
	},
	move: async (event) => {
		requireRole(event, 'owner');
		const parsed = await parseForm(
			event.request,
			z.object({ visitId: z.string().min(1), crewDayId: z.string().min(1, 'Pick a day') }),
			{
				extra: { form: 'move' },
				message: 'Pick a day to move the visit to'
			}
		);
		if (!parsed.ok) return parsed.failure;
		const r = await domainAction(
			() => moveVisit(parsed.data.visitId, parsed.data.crewDayId),
			'move'
		);
		if (r) return r;
		return { form: 'move', message: 'Moved.' };
	},
	mail: async (event) => {
		requireRole(event, 'owner');
		const key = keyFrom(await event.request.formData());
		if (!key) return fail(400, { form: 'mail', message: 'Pick a season' });
		const sent = await sendDates(key);
		return {
			form: 'mail',
			message: `${sent} ${sent === 1 ? 'homeowner was' : 'homeowners were'} mailed the date.`
		};
	}
};
