/**
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

/** The conflict between two potentials, or null when they agree or cannot be compared. */
export function potentialConflict(
	a: ComparablePotential,
	b: ComparablePotential
): PotentialConflict | null {
	if (!comparableConditions(a, b)) return null;
	const ua = a.uncertaintyMv ?? CONFLICT_RULES.defaultUncertaintyMv;
	const ub = b.uncertaintyMv ?? CONFLICT_RULES.defaultUncertaintyMv;
	const combinedUncertaintyMv = Math.round(Math.hypot(ua, ub) * 10) / 10;
	const differenceMv = Math.round((a.emMvShe - b.emMvShe) * 10) / 10;
	if (Math.abs(differenceMv) <= CONFLICT_RULES.coverageFactor * combinedUncertaintyMv) return null;
	return {
		differenceMv,
		combinedUncertaintyMv,
		message: `differs by ${Math.abs(differenceMv)} mV; combined uncertainty ±${combinedUncertaintyMv} mV`
	};
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

/**
 * For each listed potential, the others of the same centre it conflicts with. Potentials of
 * different centres are never compared.
 */
export function conflictsAmong(
	potentials: readonly ListedPotential[]
): Map<string, ConflictFlag[]> {
	const flags = new Map<string, ConflictFlag[]>();
	for (let i = 0; i < potentials.length; i++) {
		for (let j = i + 1; j < potentials.length; j++) {
			const a = potentials[i] as ListedPotential;
			const b = potentials[j] as ListedPotential;
			if (a.centre.accession !== b.centre.accession) continue;
			const c = potentialConflict(a, b);
			if (!c) continue;
			const add = (from: ListedPotential, to: ListedPotential) => {
				const list = flags.get(from.accession) ?? [];
				list.push({ accession: to.accession, message: `${to.accession}: ${c.message}` });
				flags.set(from.accession, list);
			};
			add(a, b);
			add(b, a);
		}
	}
	return flags;
}
