import { FEATURE_LABELS, VISIT_LABELS, type FeatureKind, type VisitKind } from '$lib/care/kinds';

export const featureLabel = (kind: string) => FEATURE_LABELS[kind as FeatureKind] ?? kind;
export const visitLabel = (kind: string) => VISIT_LABELS[kind as VisitKind] ?? kind;

export const VISIT_STATUS: Record<string, string> = {
	due: 'Due',
	dated: 'Dated',
	done: 'Done',
	cancelled: 'Cancelled'
};
