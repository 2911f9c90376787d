import {
	TRANSFER_MASSES_AMU,
	WIGNER_VALID_U,
	adaptiveVibrationalLevels,
	assessDoubleWell,
	barrierFrequencyRatio,
	bellKappa,
	bellKappaLog10,
	crossoverTemperatureK,
	interpolateWavefunction,
	isotopeEffectFromSplittings,
	isotopeEffectRefusal,
	potentialFunction,
	wignerKappa,
	type AdaptiveLevels,
	type DoubleWellAssessment,
	type GridConvergence,
	type VibrationalLevels
} from '$lib/science';
import { MAX_GRID_POINTS, type TunnellingRequest } from '$lib/schemas/calc';

/* The tunnelling calculator: factors for a barrier and levels of a potential, with cautions. */
export interface TunnellingResult {
	kappa: {
		/** u = hν‡/k_BT. */
		u: number;
		crossoverTemperatureK: number;
		wigner: number;
		bell: number | null;
		bellTruncated: number | null;
		bellTruncatedLog10: number | null;
		notes: string[];
	} | null;
	levels: (VibrationalLevels & { grid: GridConvergence }) | null;
	doubleWell: (DoubleWellAssessment & { barrierNote: string | null }) | null;
	isotopeEffect: {
		splittingHCm1: number;
		splittingDCm1: number;
		/** (Δ_H/Δ_D)², rounded to one significant figure: an order of magnitude. */
		kie: number;
		grids: { H: GridConvergence; D: GridConvergence };
	} | null;
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

/** A positive number rounded to `digits` significant figures. */
export function roundSignificant(value: number, digits: number): number {
	if (value === 0 || !Number.isFinite(value)) return value;
	return Number(value.toPrecision(digits));
}

const fixed = (v: number, digits: number) => v.toFixed(digits).replace('-', '−');

function kappaFactors(request: TunnellingRequest & { imagFreqCm1: number }) {
	const { imagFreqCm1: nu, temperatureK: t } = request;
	const notes: string[] = [];
	const u = barrierFrequencyRatio(nu, t);
	const tc = crossoverTemperatureK(nu);
	let bell: number | null = null;
	if (u < 2 * Math.PI) {
		bell = bellKappa(nu, t);
	} else {
		notes.push(
			`u = hν‡/k_BT = ${fixed(u, 2)} ≥ 2π (below the crossover temperature T_c = hν‡/2πk_B = ${fixed(tc, 1)} K): the infinite-parabola correction diverges; give the barrier height for the truncated form.`
		);
	}
	const wigner = wignerKappa(nu, t);
	if (u > WIGNER_VALID_U) {
		notes.push(
			bell === null
				? `u = ${fixed(u, 2)}: far beyond the validity of Wigner’s correction (u ≤ ${WIGNER_VALID_U}, where it is within 2 % of the full parabolic-barrier factor); do not use it.`
				: `u = ${fixed(u, 2)} > ${WIGNER_VALID_U}: Wigner’s leading term (${fixed(wigner, 3)}) is ${fixed((100 * (bell - wigner)) / bell, 0)} % below the full parabolic-barrier factor (Bell, infinite parabola: ${fixed(bell, 3)}); it is within 2 % only up to u = ${WIGNER_VALID_U}, and κ_W = 1.5 at u ≈ 3.46. Prefer Bell’s form.`
		);
	}
	let bellTruncated: number | null = null;
	let bellTruncatedLog10: number | null = null;
	if (request.barrierKJmol !== undefined) {
		bellTruncatedLog10 = bellKappaLog10(nu, t, request.barrierKJmol);
		const value = 10 ** bellTruncatedLog10;
		if (Number.isFinite(value)) {
			bellTruncated = value;
		} else {
			notes.push(
				`Bell’s truncated κ = 10^${fixed(bellTruncatedLog10, 1)} exceeds double precision: it is given as its logarithm only (bellTruncatedLog10).`
			);
		}
		if (u >= 2 * Math.PI) {
			notes.push(
				`Below T_c = ${fixed(tc, 1)} K the truncated factor is set by tunnelling far below the barrier top, where a parabola rarely describes the barrier: an order of magnitude at best.`
			);
		}
	}
	return { u, crossoverTemperatureK: tc, wigner, bell, bellTruncated, bellTruncatedLog10, notes };
}

export function runTunnelling(request: TunnellingRequest): TunnellingResult {
	const notes: string[] = [];
	const kappa =
		request.imagFreqCm1 === undefined
			? null
			: kappaFactors({ ...request, imagFreqCm1: request.imagFreqCm1 });
	let levels: TunnellingResult['levels'] = null;
	let doubleWell: TunnellingResult['doubleWell'] = null;
	let isotopeEffect: TunnellingResult['isotopeEffect'] = null;
	if (request.potential) {
		const p = request.potential;
		const { v } = potentialFunction(
			p.kind === 'double-well'
				? quarticDoubleWell(p.barrierKcalMol, p.halfSeparationA, p.asymmetryKcalMol)
				: p.points
		);
		// The grid: as given where given, otherwise chosen from the potential. A double well
		// starts from ±2a; sampled points from their span (which bounds it).
		const given = request.xMinA !== undefined && request.xMaxA !== undefined;
		const start =
			p.kind === 'double-well'
				? { xMinA: -2 * p.halfSeparationA, xMaxA: 2 * p.halfSeparationA }
				: {};
		// The cost bound, in 600-point solutions: 4 for the levels asked for, 2 for each of the
		// H and D pairs of the isotope effect (8 in all, ≈ 3 s on a 2-core machine; the
		// calculation's time limit is CALC_TIME_LIMIT_MS).
		const solve = (massAmu: number, count: number, workBudget: number): AdaptiveLevels =>
			adaptiveVibrationalLevels({
				potential: p.kind === 'double-well' ? v : p.points,
				massAmu,
				levels: count,
				...(given ? { xMinA: request.xMinA, xMaxA: request.xMaxA, fixedRange: true } : start),
				points: request.points,
				maxPoints: MAX_GRID_POINTS,
				workBudget
			});
		const massAmu = request.massAmu ?? TRANSFER_MASSES_AMU[request.isotope];
		const solved = solve(massAmu, request.levels, 4);
		const { comparison: _comparison, ...shown } = solved;
		levels = shown;
		if (!solved.grid.converged) notes.push(`The levels are not converged. ${solved.grid.message}`);
		const assess = (l: AdaptiveLevels) =>
			assessDoubleWell(l, { potential: v, comparison: l.comparison });
		let solvedAssessment: ReturnType<typeof assess> | null = null;
		try {
			solvedAssessment = assess(solved);
			doubleWell = { ...solvedAssessment, barrierNote: barrierNote(request, solvedAssessment) };
		} catch (e) {
			if (!(e instanceof RangeError)) throw e;
			notes.push(`${e.message}; the double-well assessment and isotope effect are not shown.`);
		}
		if (doubleWell) {
			const reuse = (isotope: 'H' | 'D') =>
				request.massAmu === undefined && request.isotope === isotope;
			const h = reuse('H') ? solved : solve(TRANSFER_MASSES_AMU.H, 2, 2);
			try {
				const hAssessment = h === solved && solvedAssessment ? solvedAssessment : assess(h);
				// Outside the nonadiabatic regime there is no isotope effect to give: no D levels.
				const refusal = isotopeEffectRefusal(hAssessment);
				if (refusal) throw new RangeError(refusal);
				const d = reuse('D') ? solved : solve(TRANSFER_MASSES_AMU.D, 2, 2);
				const dAssessment = d === solved && solvedAssessment ? solvedAssessment : assess(d);
				const kie = isotopeEffectFromSplittings(hAssessment, dAssessment);
				isotopeEffect = {
					splittingHCm1: kie.splittingHCm1,
					splittingDCm1: kie.splittingDCm1,
					kie: roundSignificant(kie.kie, 1),
					grids: { H: h.grid, D: d.grid }
				};
			} catch (e) {
				if (!(e instanceof RangeError)) throw e;
				notes.push(`${e.message[0]!.toUpperCase()}${e.message.slice(1)}.`);
			}
		}
	}
	return { kappa, levels, doubleWell, isotopeEffect, notes };
}

/** Why the barrier shown differs from the barrier entered (a tilt), or null when it does not. */
function barrierNote(request: TunnellingRequest, a: DoubleWellAssessment): string | null {
	const p = request.potential;
	if (p?.kind !== 'double-well' || p.asymmetryKcalMol === 0) return null;
	const upper = a.barrierKcalMol - Math.abs(a.asymmetryKcalMol);
	return `The barrier entered (${p.barrierKcalMol} kcal/mol) is that of the untilted well. The tilt moves the minima to ${fixed(a.minimaA[0], 3)} and ${fixed(a.minimaA[1], 3)} Å and the top to ${fixed(a.topA, 3)} Å: the barrier is ${fixed(a.barrierKcalMol, 3)} kcal/mol from the lower minimum and ${fixed(upper, 3)} kcal/mol from the upper one.`;
}

/** Curves to draw: V(x) and the wavefunctions on a fine sampling of the grid's interval. */
export interface TunnellingPlot {
	xA: number[];
	potentialKcalMol: number[];
	wavefunctions: number[][];
}

/**
 * The potential and the wavefunctions between the DVR's grid points, for the page's plot (the
 * levels converge on far coarser grids than a smooth curve needs): V from the potential itself,
 * ψ by the DVR's own sinc interpolation. Not part of the API answer.
 */
export function tunnellingPlot(
	request: TunnellingRequest,
	levels: NonNullable<TunnellingResult['levels']>,
	samples = 241
): TunnellingPlot | null {
	const p = request.potential;
	if (!p) return null;
	const { v } = potentialFunction(
		p.kind === 'double-well'
			? quarticDoubleWell(p.barrierKcalMol, p.halfSeparationA, p.asymmetryKcalMol)
			: p.points
	);
	const { xMinA, xMaxA } = levels.grid;
	const xA = Array.from(
		{ length: samples },
		(_, i) => xMinA + ((xMaxA - xMinA) * i) / (samples - 1)
	);
	return {
		xA,
		// Clamped: rounding must not step outside a sampled potential's span.
		potentialKcalMol: xA.map((x) => v(Math.min(xMaxA, Math.max(xMinA, x)))),
		wavefunctions: levels.wavefunctions.map((psi) =>
			xA.map((x) => interpolateWavefunction(levels.gridA, psi, x))
		)
	};
}
