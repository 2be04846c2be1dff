/**
 * Stored designs from before features existed held one fountain's water system at the top level
 * (outlets, supply, branches, pump, basin). `upgradeDesign` moves those into one fountain feature
 * and leaves everything else as it was, so the design prices exactly as it did. It is idempotent
 * and pure; the database migration does the same in SQL, and `readDesign` applies it on every read
 * so a design from an old export or a frozen copy still opens.
 */
import { designSchema, type Design } from './schema';

const LEGACY_KEYS = ['outlets', 'supply', 'branches', 'pumpModelId', 'basin'] as const;

/** The id the upgrade gives the one fountain feature (the SQL migration uses the same). */
export const UPGRADED_FOUNTAIN_ID = 'fountain-1';

const isRecord = (v: unknown): v is Record<string, unknown> =>
	typeof v === 'object' && v !== null && !Array.isArray(v);

export function isLegacyDesign(raw: unknown): boolean {
	return isRecord(raw) && LEGACY_KEYS.some((k) => k in raw);
}

export function upgradeDesign(raw: unknown): unknown {
	if (!isLegacyDesign(raw)) return raw;
	const legacy = raw as Record<string, unknown>;
	const rest: Record<string, unknown> = {};
	const fountain: Record<string, unknown> = {
		id: UPGRADED_FOUNTAIN_ID,
		kind: 'fountain',
		name: 'Fountain'
	};
	for (const [key, value] of Object.entries(legacy)) {
		if ((LEGACY_KEYS as readonly string[]).includes(key)) {
			if (value !== undefined && value !== null) fountain[key] = value;
		} else rest[key] = value;
	}
	const hasWater = LEGACY_KEYS.some((k) => k !== 'pumpModelId' && fountain[k] !== undefined);
	const existing = Array.isArray(legacy.features) ? legacy.features : [];
	return { ...rest, features: hasWater ? [fountain, ...existing] : existing };
}

/** A stored design of either shape, validated; the parse error when it is not a design. */
export function readDesign(raw: unknown) {
	return designSchema.safeParse(upgradeDesign(raw));
}

/** The stored design in the current shape, for code that edits it as plain data. */
export const upgradedDesign = (raw: unknown) => upgradeDesign(raw) as Design;
