import type { VersionWarning } from '$lib/schemas/versionWarning';

/*
 * Warnings as readers see them, apart from their schema (schemas/versionWarning.ts) so that the
 * pages showing warnings do not ship the validation library to the browser.
 */

/**
 * The rule conflict warnings stored before the coverage factor k = 2 (catalogue/conflicts.ts)
 * were made under. They carry no `source` (new ones carry the rule there); shown beside them so
 * that a stored warning is read under the rule that made it, its own text unchanged.
 */
export const EARLIER_CONFLICT_RULE =
	'flagged under the earlier rule: difference beyond √(u₁² + u₂²) (k = 1), 15 mV assumed where no uncertainty was stated';

/**
 * A warning as one line of text, as CSV checks and batch rows show it. A conflict warning stored
 * without a source was made under the earlier rule (k = 1): it says so, its text unchanged.
 */
export function warningText(w: VersionWarning): string {
	if (w.kind === 'range' && w.source) return `${w.message} (range source: ${w.source})`;
	if (w.kind === 'conflict' && !w.source) return `${w.message} (${EARLIER_CONFLICT_RULE})`;
	return w.message;
}
