/**
 * A price list validated once, for a page that prices design after design against it (the builder,
 * on every change): `estimate` and `priceWithOverrides` take it without validating it again. It is a
 * frozen copy, so it cannot have changed since the check.
 */
import { catalogSchema, type ParsedCatalog } from './schema';

const prepared = new WeakSet<object>();

function deepFreeze<T>(value: T): T {
	if (value !== null && typeof value === 'object' && !Object.isFrozen(value)) {
		Object.freeze(value);
		for (const inner of Object.values(value)) deepFreeze(inner);
	}
	return value;
}

/** The price list validated and frozen; throws the schema's error when it is not valid. */
export function prepareCatalog(catalog: unknown): ParsedCatalog {
	const parsed = deepFreeze(structuredClone(catalogSchema.parse(catalog)));
	prepared.add(parsed);
	return parsed;
}

/** A prepared price list as it is, anything else through the schema (as `safeParse` answers). */
export function readCatalog(catalog: unknown) {
	if (typeof catalog === 'object' && catalog !== null && prepared.has(catalog)) {
		return { success: true as const, data: catalog as ParsedCatalog };
	}
	return catalogSchema.safeParse(catalog);
}
