/*
 * When two potentials of the same centre and couple disagree. They are compared only when their
 * conditions are comparable (pH within CONFLICT_RULES.phWindow, temperature within
 * temperatureWindowK), and conflict when they differ by more than their combined standard
 * uncertainty, √(u₁² + u₂²), times the coverage factor.
 */
export const CONFLICT_RULES = {
	phWindow: 0.5,
	temperatureWindowK: 10,
	/** Stands in for a missing uncertainty (common practice, no source: redox titrations are usually quoted to ±10–20 mV). */
	defaultUncertaintyMv: 15,
	/** 1: disagreement beyond the combined uncertainty itself, as the registry's rule states. */
	coverageFactor: 1,
	/** Unstated temperatures are taken as 25 °C, as the normalisation to SHE does. */
	defaultTemperatureK: 298.15
} as const;

export interface ComparablePotential {
	couple: string;
	emMvShe: number;
	uncertaintyMv: number | null;
	ph: number | null;
	temperatureK: number | null;
}

export interface PotentialConflict {
	differenceMv: number;
	combinedUncertaintyMv: number;
	message: string;
}

/** Whether two potentials' conditions allow a comparison at all. */
export function comparableConditions(a: ComparablePotential, b: ComparablePotential): boolean {
	if (a.couple !== b.couple) return false;
	// An unstated pH cannot be compared with a stated one; two unstated ones are taken as alike.
	if ((a.ph === null) !== (b.ph === null)) return false;
	if (a.ph !== null && b.ph !== null && Math.abs(a.ph - b.ph) > CONFLICT_RULES.phWindow)
		return false;
	const ta = a.temperatureK ?? CONFLICT_RULES.defaultTemperatureK;
	const tb = b.temperatureK ?? CONFLICT_RULES.defaultTemperatureK;
	return Math.abs(ta - tb) <= CONFLICT_RULES.temperatureWindowK;
}

/**
 * The rounded difference a − b (mV) and the combined uncertainty when the two conflict, or null.
 * Allocation-free apart from its result, for scanning many candidates.
 */
function conflictSizes(
	a: ComparablePotential,
	b: ComparablePotential
): { differenceMv: number; combinedUncertaintyMv: number } | null {
	if (!comparableConditions(a, b)) return null;
	const ua = a.uncertaintyMv ?? CONFLICT_RULES.defaultUncertaintyMv;
	const ub = b.uncertaintyMv ?? CONFLICT_RULES.defaultUncertaintyMv;
	const combinedUncertaintyMv = Math.round(Math.hypot(ua, ub) * 10) / 10;
	const differenceMv = Math.round((a.emMvShe - b.emMvShe) * 10) / 10;
	if (Math.abs(differenceMv) <= CONFLICT_RULES.coverageFactor * combinedUncertaintyMv) return null;
	return { differenceMv, combinedUncertaintyMv };
}

function conflictMessage(c: { differenceMv: number; combinedUncertaintyMv: number }): string {
	return `differs by ${Math.abs(c.differenceMv)} mV; combined uncertainty ±${c.combinedUncertaintyMv} mV`;
}

/** The conflict between two potentials, or null when they agree or cannot be compared. */
export function potentialConflict(
	a: ComparablePotential,
	b: ComparablePotential
): PotentialConflict | null {
	const c = conflictSizes(a, b);
	return c ? { ...c, message: conflictMessage(c) } : null;
}

/** The rule in words, shown beside every conflict flag. */
export function describeConflictRule(): string {
	const r = CONFLICT_RULES;
	return `same centre and couple, pH within ${r.phWindow}, temperature within ${r.temperatureWindowK} K, difference beyond √(u₁² + u₂²); ${r.defaultUncertaintyMv} mV assumed where no uncertainty is given (common practice, no source)`;
}

/** A potential as listed with its centre, enough to compare it with its neighbours. */
export interface ListedPotential extends ComparablePotential {
	accession: string;
	centre: { accession: string };
}

export interface ConflictFlag {
	accession: string;
	message: string;
}

/** The conflicts of one shown potential: how many, and the first few, largest difference first. */
export interface ConflictSummary {
	count: number;
	listed: ConflictFlag[];
}

/** How many conflicting values are named per potential; the rest are counted. */
export const CONFLICTS_LISTED = 5;

/** Candidates of one centre and couple, those with a pH sorted by it, those without apart. */
interface Bucket {
	withPh: ListedPotential[];
	withoutPh: ListedPotential[];
}

function bucketKey(p: ListedPotential): string {
	return `${p.centre.accession}|${p.couple}`;
}

/** Index of the first candidate whose pH is at least `ph` (candidates sorted by pH). */
function lowerBound(sorted: readonly ListedPotential[], ph: number): number {
	let lo = 0;
	let hi = sorted.length;
	while (lo < hi) {
		const mid = (lo + hi) >>> 1;
		if ((sorted[mid] as ListedPotential).ph! < ph) lo = mid + 1;
		else hi = mid;
	}
	return lo;
}

/**
 * For each shown potential, the candidates (approved values the reader may see) it conflicts
 * with under `potentialConflict`. Candidates are grouped by centre and couple and sorted by pH
 * once (O(n log n)); each shown potential then looks only at the pH window around its own pH,
 * so a page of r rows over n candidates costs O(n log n + r·w) for w values in a window, and the
 * answer holds at most CONFLICTS_LISTED names per row however many values disagree.
 */
export function conflictsForShown(
	shown: readonly ListedPotential[],
	candidates: readonly ListedPotential[],
	listed: number = CONFLICTS_LISTED
): Map<string, ConflictSummary> {
	const buckets = new Map<string, Bucket>();
	for (const c of candidates) {
		const key = bucketKey(c);
		let b = buckets.get(key);
		if (!b) buckets.set(key, (b = { withPh: [], withoutPh: [] }));
		(c.ph === null ? b.withoutPh : b.withPh).push(c);
	}
	for (const b of buckets.values()) b.withPh.sort((x, y) => x.ph! - y.ph!);

	const result = new Map<string, ConflictSummary>();
	for (const p of shown) {
		const b = buckets.get(bucketKey(p));
		if (!b) continue;
		let window: readonly ListedPotential[];
		if (p.ph === null) window = b.withoutPh;
		else {
			const from = lowerBound(b.withPh, p.ph - CONFLICT_RULES.phWindow);
			const to = lowerBound(b.withPh, p.ph + CONFLICT_RULES.phWindow + 1e-9);
			window = b.withPh.slice(from, to);
		}
		// The `listed` largest differences, kept sorted (largest first) as the scan goes.
		const top: {
			other: ListedPotential;
			sizes: { differenceMv: number; combinedUncertaintyMv: number };
		}[] = [];
		let count = 0;
		for (const other of window) {
			if (other.accession === p.accession) continue;
			const sizes = conflictSizes(p, other);
			if (!sizes) continue;
			count++;
			const size = Math.abs(sizes.differenceMv);
			if (top.length === listed && size <= Math.abs(top[listed - 1]!.sizes.differenceMv)) continue;
			let at = top.length;
			while (at > 0 && Math.abs(top[at - 1]!.sizes.differenceMv) < size) at--;
			top.splice(at, 0, { other, sizes });
			if (top.length > listed) top.pop();
		}
		if (count === 0) continue;
		result.set(p.accession, {
			count,
			listed: top.map(({ other, sizes }) => ({
				accession: other.accession,
				message: `${other.accession}: ${conflictMessage(sizes)}`
			}))
		});
	}
	return result;
}
