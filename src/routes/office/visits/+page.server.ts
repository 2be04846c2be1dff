import { requireRole } from '$lib/server/auth/access';
import { addDays, isDate, zonedInstant } from '$lib/scheduling/zone';
import { agendaThumbs } from '$lib/server/photos/visit-photos';
import { agenda, localDate } from '$lib/server/visits/agenda';
import { salespeople } from '$lib/server/visits/availability';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales');
	const tz = (await event.parent()).firm.timeZone;
	const asked = event.url.searchParams.get('day') ?? '';
	const day = isDate(asked) ? asked : localDate(new Date(), tz);
	const view = event.url.searchParams.get('view') === 'week' ? 'week' : 'day';
	const wanted = event.url.searchParams.get('person');
	// The owner sees everyone unless a person is picked; a salesperson sees their own.
	const person =
		user.role === 'owner' ? wanted || null : wanted === 'all' ? null : (wanted ?? user.id);
	const days = view === 'week' ? 7 : 1;
	const visits = await agenda(
		zonedInstant(day, 0, tz),
		zonedInstant(addDays(day, days), 0, tz),
		person
	);
	const [people, thumbs] = await Promise.all([salespeople(), agendaThumbs(visits)]);
	return {
		day,
		view,
		days,
		person,
		people,
		visits: visits.map((v) => ({ ...v, photos: thumbs.get(v.id) ?? [] }))
	};
};
