// How a job's stage and number read on screen and in mail.
import type { JobStage } from '../platform/db/schema';

export const STAGE_LABELS: Record<JobStage, string> = {
	scheduled: 'Scheduled',
	underway: 'Underway',
	punch_list: 'Punch list',
	complete: 'Complete',
	paid: 'Paid'
};

export const jobRef = (n: number) => `J-${n}`;
