// The demo care plan and season settings for Copperleaf Water & Stone (invented figures), so the
// Care section has something to offer. Safe to run twice.
import { carePlans, careSeasonSettings } from '../../src/lib/server/platform/db/schema';
import type { Db } from './shared';

export async function seedCare(db: Db): Promise<void> {
	await db
		.insert(carePlans)
		.values({
			id: 'demo-care-plan',
			name: 'Four-season care',
			summary:
				'We start your feature in spring, clean it out in summer and shut it down before the first hard frost.',
			terms: [
				'We come once in each window and e-mail you the day beforehand; ask for another day from that mail.',
				'Parts we use are invoiced at our price-list prices after the visit.',
				'The plan renews each year; we remind you a month before. Cancel any time from your link: visits not yet made are not charged.'
			].join('\n\n'),
			visits: [
				{
					kind: 'startup',
					minutes: 60,
					checklist: [
						'Clear leaves from the basin',
						'Set the pump back and top up',
						'Check every outlet runs evenly',
						'Test the GFCI outlet'
					]
				},
				{
					kind: 'cleanout',
					minutes: 75,
					checklist: [
						'Clean the pump intake screen',
						'Rinse the gravel or basin',
						'Check the water level and the auto-fill'
					]
				},
				{
					kind: 'shutdown',
					minutes: 60,
					checklist: [
						'Lift, rinse and store the pump',
						'Drain the lines',
						'Cover or drain the basin'
					]
				},
				{
					kind: 'lighting',
					minutes: 30,
					checklist: ['Test every fixture', 'Set the transformer timer', 'Re-aim moved fixtures']
				}
			],
			prices: {
				fountain: { small: 11000, medium: 14500, large: 19500 },
				pond: { small: 16500, medium: 22000, large: 29500 },
				stream: { small: 15000, medium: 19500, large: 26000 },
				lighting: { small: 6500, medium: 8500, large: 11500 }
			}
		})
		.onConflictDoNothing();
	// The yard the crews start from: an invented point by Linden Ford.
	await db
		.insert(careSeasonSettings)
		.values({ id: 1, depotLat: 40.0, depotLng: -105.0 })
		.onConflictDoNothing();
}
