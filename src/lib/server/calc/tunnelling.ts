import {
	TRANSFER_MASSES_AMU,
	assessDoubleWell,
	bellKappa,
	isotopeEffectFromSplittings,
	vibrationalLevels,
	wignerKappa,
	type DoubleWellAssessment,
	type PotentialKcalMol,
	type VibrationalLevels
} from '$lib/science';
import type { TunnellingRequest } from '$lib/schemas/calc';

/* The tunnelling calculator: factors for a barrier and levels of a potential, with cautions. */
export interface TunnellingResult {
	kappa: {
		wigner: number;
		bell: number | null;
		bellTruncated: number | null;
		notes: string[];
	} | null;
	levels: (VibrationalLevels & { massAmu: number }) | null;
	doubleWell: DoubleWellAssessment | null;
	isotopeEffect: { splittingHCm1: number; splittingDCm1: number; kie: number } | null;
	notes: string[];
}

/** V(x) of a symmetric quartic double well with minima at ±a and a linear tilt. */
export function quarticDoubleWell(
	barrier: number,
	a: number,
	asymmetry: number
): (x: number) => number {
	return (x) => barrier * ((x / a) ** 2 - 1) ** 2 + (asymmetry * (x + a)) / (2 * a);
}

export function runTunnelling(request: TunnellingRequest): TunnellingResult {
	const notes: string[] = [];
	let kappa: TunnellingResult['kappa'] = null;
	if (request.imagFreqCm1 !== undefined) {
		const kNotes: string[] = [];
		let bell: number | null = null;
		try {
			bell = bellKappa(request.imagFreqCm1, request.temperatureK);
		} catch (e) {
			if (!(e instanceof RangeError)) throw e;
			kNotes.push(e.message);
		}
		const bellTruncated =
			request.barrierKJmol === undefined
				? null
				: bellKappa(request.imagFreqCm1, request.temperatureK, request.barrierKJmol);
		const wigner = wignerKappa(request.imagFreqCm1, request.temperatureK);
		if (wigner > 1.5)
			kNotes.push(
				'Wigner’s correction exceeds 1.5: beyond its validity (u ≲ 2); prefer Bell’s form.'
			);
		kappa = { wigner, bell, bellTruncated, notes: kNotes };
	}
	let levels: TunnellingResult['levels'] = null;
	let doubleWell: DoubleWellAssessment | null = null;
	let isotopeEffect: TunnellingResult['isotopeEffect'] = null;
	if (request.potential) {
		const p = request.potential;
		const potential: PotentialKcalMol =
			p.kind === 'double-well'
				? quarticDoubleWell(p.barrierKcalMol, p.halfSeparationA, p.asymmetryKcalMol)
				: p.points;
		const span = p.kind === 'double-well' ? 2.5 * p.halfSeparationA : 0;
		const xs = p.kind === 'points' ? p.points.map((q) => q.xA) : [];
		const xMinA = request.xMinA ?? (p.kind === 'double-well' ? -span : Math.min(...xs));
		const xMaxA = request.xMaxA ?? (p.kind === 'double-well' ? span : Math.max(...xs));
		const massAmu = request.massAmu ?? TRANSFER_MASSES_AMU[request.isotope];
		const grid = { potential, xMinA, xMaxA, points: request.points };
		levels = { ...vibrationalLevels({ ...grid, massAmu, levels: request.levels }), massAmu };
		try {
			doubleWell = assessDoubleWell(levels);
			isotopeEffect = isotopeEffectFromSplittings(grid);
		} catch (e) {
			if (!(e instanceof RangeError)) throw e;
			notes.push(`${e.message}; the double-well assessment and isotope effect are not shown.`);
		}
	}
	return { kappa, levels, doubleWell, isotopeEffect, notes };
}
