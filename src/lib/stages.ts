// The vocabularies of the work's life: a lead's and a job's stages in order, the reasons a lead is
// closed, an estimate's and a warranty callback's status, and how each reads on screen. The database enums (platform/db/schema), the zod enums of
// the forms and every label come from here, so a stage is added in one place. No imports:
// drizzle-kit loads this file through the schema.

/** A lead from the inquiry to the sale (or closed, with a reason). */
export const LEAD_STAGES = [
	'new',
	'contacted',
	'visit_booked',
	'estimating',
	'estimate_sent',
	'sold',
	'closed'
] as const;
export type LeadStage = (typeof LEAD_STAGES)[number];

export const LEAD_STAGE_LABELS: Record<LeadStage, string> = {
	new: 'new',
	contacted: 'contacted',
	visit_booked: 'visit booked',
	estimating: 'estimating',
	estimate_sent: 'estimate sent',
	sold: 'sold',
	closed: 'closed'
};

export const CLOSE_REASONS = [
	'not_a_fit',
	'no_reply',
	'budget',
	'timing',
	'chose_another_firm',
	'other'
] as const;
export type CloseReason = (typeof CLOSE_REASONS)[number];

export const CLOSE_REASON_LABELS: Record<CloseReason, string> = {
	not_a_fit: 'not a fit',
	no_reply: 'no reply',
	budget: 'budget',
	timing: 'timing',
	chose_another_firm: 'chose another firm',
	other: 'other'
};

/** A construction job from the accepted estimate to the last payment. */
export const JOB_STAGES = ['scheduled', 'underway', 'punch_list', 'complete', 'paid'] as const;
export type JobStage = (typeof JOB_STAGES)[number];

export const JOB_STAGE_LABELS: Record<JobStage, string> = {
	scheduled: 'Scheduled',
	underway: 'Underway',
	punch_list: 'Punch list',
	complete: 'Complete',
	paid: 'Paid'
};

/** The stages a person moves a job to by hand; "paid" follows from the payments alone. */
export const JOB_STAGES_BY_HAND = ['scheduled', 'underway', 'punch_list', 'complete'] as const;

/** An estimate version from the builder to the homeowner's answer. */
export const ESTIMATE_STATUSES = ['draft', 'sent', 'accepted', 'declined'] as const;
export type EstimateStatus = (typeof ESTIMATE_STATUSES)[number];

export const ESTIMATE_STATUS_LABELS: Record<EstimateStatus, string> = {
	draft: 'Draft',
	sent: 'Sent',
	accepted: 'Accepted',
	declined: 'Declined'
};

/** A warranty callback from the homeowner's report to the fix. */
export const CALLBACK_STATUSES = ['reported', 'scheduled', 'fixed'] as const;
export type CallbackStatus = (typeof CALLBACK_STATUSES)[number];

export const CALLBACK_STATUS_LABELS: Record<CallbackStatus, string> = {
	reported: 'Reported',
	scheduled: 'Scheduled',
	fixed: 'Fixed'
};

/** The same, in the homeowner's words on their link page. */
export const CALLBACK_STATUS_FOR_HOMEOWNER: Record<CallbackStatus, string> = {
	reported: 'reported',
	scheduled: 'visit booked',
	fixed: 'fixed'
};
