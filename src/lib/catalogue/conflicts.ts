/*
 * When two potentials of the same centre and couple differ beyond their stated uncertainties.
 * The one rule, used by entry pages (flags), curation checks (form warnings, the API's warnings)
 * and CSV checks (stored warnings) alike:
 *
 * - compared only when their conditions are comparable: the same couple, pH within
 *   CONFLICT_RULES.phWindow (both stated, or both unstated), temperature within
 *   temperatureWindowK (unstated taken as 25 °C, as the normalisation to SHE does);
 * - compared only when both values state an uncertainty: "differ beyond their stated
 *   uncertainties" cannot be said of a value that states none, and any number put in its place
 *   would be invented. Such values are never flagged, and their pages say so;
 * - flagged when |E₁ − E₂| > k·u_c, with u_c = √(u₁² + u₂²) the combined standard uncertainty of
 *   the difference of two uncorrelated values (JCGM 100:2008, GUM, §5.1.2, sensitivity
 *   coefficients ±1) and k = 2 the coverage factor, which gives an interval of about 95 % for a
 *   normal distribution (GUM §6.2.1, §6.3.3). The stated uncertainties are read as standard
 *   uncertainties, as the entry form asks ("one standard uncertainty").
 *
 * Two replicate values 30 mV apart with ±20 mV each (u_c = 28.3 mV, k·u_c = 56.6 mV) are
 * therefore not flagged; before this rule used k = 1 and an assumed 15 mV for missing
 * uncertainties, and called them conflicting. Warnings stored with CSV rows under that earlier
 * rule are kept as written (a stored warning is part of the row's record); they carry no `source`,
 * which is how `warningText` (schemas/versionWarning.ts) tells them apart and names their rule.
 */
export const CONFLICT_RULES = {
	phWindow: 0.5,
	temperatureWindowK: 10,
	/** Coverage factor k (≈95 % for a normal distribution; JCGM 100:2008 §6.2.1, §6.3.3). */
	coverageFactor: 2,
	/** Unstated temperatures are taken as 25 °C, as the normalisation to SHE does. */
	defaultTemperatureK: 298.15
} as const;

/** The heading of a flag, in neutral words (a difference to look at, not an error). */
export const CONFLICT_HEADING = 'Values differ beyond their stated uncertainties';

export interface ComparablePotential {
	couple: string;
	emMvShe: number;
	uncertaintyMv: number | null;
	ph: number | null;
	temperatureK: number | null;
}

export interface PotentialConflict {
	/** a − b, mV, rounded to 0.1. */
	differenceMv: number;
	/** u_c = √(u₁² + u₂²), mV, rounded to 0.1. */
	combinedUncertaintyMv: number;
	/** k·u_c, mV, rounded to 0.1: the limit the difference exceeds. */
	limitMv: number;
	message: string;
}

type ConflictSizes = Omit<PotentialConflict, 'message'>;

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
 * The sizes of the difference when the two differ beyond k·u_c, or null (agreeing, not
 * comparable, or an uncertainty not stated). Allocation-free apart from its result, for scanning
 * many candidates.
 */
function conflictSizes(a: ComparablePotential, b: ComparablePotential): ConflictSizes | null {
	if (a.uncertaintyMv === null || b.uncertaintyMv === null) return null;
	if (!comparableConditions(a, b)) return null;
	const uc = Math.hypot(a.uncertaintyMv, b.uncertaintyMv);
	const difference = a.emMvShe - b.emMvShe;
	// Compared unrounded; rounded only for display.
	if (Math.abs(difference) <= CONFLICT_RULES.coverageFactor * uc) return null;
	const round = (x: number) => Math.round(x * 10) / 10;
	return {
		differenceMv: round(difference),
		combinedUncertaintyMv: round(uc),
		limitMv: round(CONFLICT_RULES.coverageFactor * uc)
	};
}

function conflictMessage(c: ConflictSizes): string {
	return `differs by ${Math.abs(c.differenceMv)} mV, more than ${CONFLICT_RULES.coverageFactor} × √(u₁² + u₂²) = ${c.limitMv} mV`;
}

/** The difference between two potentials when it exceeds the rule, or null. */
export function potentialConflict(
	a: ComparablePotential,
	b: ComparablePotential
): PotentialConflict | null {
	const c = conflictSizes(a, b);
	return c ? { ...c, message: conflictMessage(c) } : null;
}

/** The rule in words, shown beside every flag and stored as the `source` of new warnings. */
export function describeConflictRule(): string {
	const r = CONFLICT_RULES;
	return `same centre and couple, pH within ${r.phWindow}, temperature within ${r.temperatureWindowK} K; flagged when the difference exceeds k·√(u₁² + u₂²) with coverage factor k = ${r.coverageFactor} (about 95 %, JCGM 100:2008 GUM §6.2–6.3); values without a stated uncertainty are not compared`;
}

/**
 * The warning a proposed value gets for an approved one it differs from (forms, the API and
 * CSV checks word it alike): message, the rule as its source, and the approved accession.
 */
export function conflictWarning(
	other: { accession: string; emMvShe: number },
	conflict: PotentialConflict
): { message: string; source: string; accession: string } {
	return {
		message: `Approved ${other.accession} (${other.emMvShe} mV vs SHE, at comparable pH and temperature): ${conflict.message}.`,
		source: describeConflictRule(),
		accession: other.accession
	};
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
		const top: { other: ListedPotential; sizes: ConflictSizes }[] = [];
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
