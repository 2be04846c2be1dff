/** For the specs: the first fountain of a design, typed for editing (input) or reading (parsed). */
import type { Design, FeatureInput, Fountain, ParsedDesign } from '../../src/lib/estimating/schema';

type FountainInput = Extract<FeatureInput, { kind: 'fountain' }>;

export function fountainIn(design: ParsedDesign): Fountain;
export function fountainIn(design: Design | Record<string, unknown>): FountainInput;
export function fountainIn(design: { features?: unknown }) {
	const list = (design.features ?? []) as { kind: string }[];
	const found = list.find((f) => f.kind === 'fountain');
	if (!found) throw new Error('the design has no fountain');
	return found;
}
