import {
	BOLTZMANN_EV_PER_K,
	ELEMENTARY_CHARGE_C,
	HBAR_J_S,
	STANDARD_TEMPERATURE_K
} from './constants';
import {
	MOSER_DUTTON_CONTACT_A,
	couplingAtDistance,
	deltaGFromPotentials,
	marcusRate,
	moserDuttonLog10Rate,
	type RateResult
} from './electronTransfer';
import { requireFinite, requireInRange, requirePositive } from './guards';
import { percentile, seededRandom } from './random';

/*
 * Kinetics of one electron crossing a network of redox centres.
 *
 * Model: one electron at a time hops between centres; every hop is reversible, its downhill
 * direction given by the chosen rate model and its uphill direction by detailed balance
 * (k_up = k_down · exp(−|ΔG°|/k_BT)). The exit centre is absorbing (drained at once) and the
 * entry is refilled at once, so the steady throughput is 1 / (mean first-passage time from
 * entry to exit). The mean first-passage times τ solve, for every centre i other than the exit,
 *
 *   Σ_j k_ij (τ_i − τ_j) = 1,   τ_exit = 0
 *
 * References: N. G. van Kampen, *Stochastic Processes in Physics and Chemistry* (3rd ed., 2007),
 * §XII.2 (first-passage times of master equations); hop rates as in electronTransfer.ts; the
 * solution by subtraction-free state reduction (see meanFirstPassage).
 * Works for any connected graph (branches and loops), not only linear chains.
 */

export type ChainModel = 'moser-dutton' | 'marcus';

export interface ChainCentre {
	id: string;
	emMv: number;
	/** Standard uncertainty of Em, mV (used by monteCarloChain). */
	emSigmaMv?: number;
}

export interface ChainHop {
	from: string;
	to: string;
	edgeDistanceA: number;
	/** Standard uncertainty of the distance, Å (used by monteCarloChain). */
	edgeSigmaA?: number;
}

export interface ChainInput {
	centres: ChainCentre[];
	hops: ChainHop[];
	entry: string;
	exit: string;
	lambdaEv: number;
	/** @default 298.15 */
	temperatureK?: number;
	/** @default 0.76 */
	packingDensity?: number;
	model: ChainModel;
	/**
	 * Marcus couplings H(R) = H₀ exp(−β(R − R₀)/2). By default β = ln10·(1.2 − 0.8ρ), the
	 * Moser–Dutton distance decay, and H₀ gives an activationless rate of 10¹³ s⁻¹ at 3.6 Å.
	 */
	coupling?: { h0Ev: number; betaPerA: number; r0A?: number };
}

export interface HopRates {
	from: string;
	to: string;
	/** from → to, s⁻¹ */
	forwardRate: number;
	/** to → from, s⁻¹ */
	backwardRate: number;
	/** Driving force of from → to, eV (negative downhill). */
	deltaGEv: number;
}

export interface Sensitivity {
	from: string;
	to: string;
	/** d ln(throughput) / d ln(k) when both directions of the hop are scaled together. */
	value: number;
}

export interface ChainResult {
	hops: HopRates[];
	meanTransitTimeS: number;
	throughputPerS: number;
	rateLimitingHop: { from: string; to: string };
	sensitivities: Sensitivity[];
	warnings: string[];
}

interface PreparedChain {
	ids: string[];
	index: Map<string, number>;
	hops: HopRates[];
	warnings: string[];
}

/** The default Marcus coupling, calibrated to the Moser–Dutton ruler at contact. */
export function defaultChainCoupling(
	lambdaEv: number,
	temperatureK: number,
	packingDensity: number
) {
	const kT = BOLTZMANN_EV_PER_K * temperatureK;
	const hbarEvS = HBAR_J_S / ELEMENTARY_CHARGE_C;
	const h0Ev = Math.sqrt((1e13 * hbarEvS * Math.sqrt(4 * Math.PI * lambdaEv * kT)) / (2 * Math.PI));
	return { h0Ev, betaPerA: Math.LN10 * (1.2 - 0.8 * packingDensity), r0A: MOSER_DUTTON_CONTACT_A };
}

function validate(input: ChainInput): void {
	if (input.centres.length < 2) throw new RangeError('a chain needs at least two centres');
	const ids = new Set<string>();
	for (const c of input.centres) {
		if (ids.has(c.id)) throw new RangeError(`centre "${c.id}" is listed twice`);
		ids.add(c.id);
		requireFinite(c.emMv, `emMv of ${c.id}`);
		if (c.emSigmaMv !== undefined) requireInRange(c.emSigmaMv, `emSigmaMv of ${c.id}`, 0, 1000);
	}
	for (const h of input.hops) {
		for (const end of [h.from, h.to]) {
			if (!ids.has(end))
				throw new RangeError(`hop ${h.from} → ${h.to} names unknown centre "${end}"`);
		}
		if (h.from === h.to) throw new RangeError(`hop ${h.from} → ${h.to} joins a centre to itself`);
		requireInRange(h.edgeDistanceA, `edgeDistanceA of ${h.from} → ${h.to}`, 0, 100);
		if (h.edgeSigmaA !== undefined)
			requireInRange(h.edgeSigmaA, `edgeSigmaA of ${h.from} → ${h.to}`, 0, 50);
	}
	if (!ids.has(input.entry))
		throw new RangeError(`entry "${input.entry}" is not one of the centres`);
	if (!ids.has(input.exit)) throw new RangeError(`exit "${input.exit}" is not one of the centres`);
	if (input.entry === input.exit) throw new RangeError('entry and exit must be different centres');
	requirePositive(input.lambdaEv, 'lambdaEv');
	requirePositive(input.temperatureK ?? STANDARD_TEMPERATURE_K, 'temperatureK');
	requireInRange(input.packingDensity ?? 0.76, 'packingDensity', 0, 1);
}

function prepare(input: ChainInput): PreparedChain {
	const t = input.temperatureK ?? STANDARD_TEMPERATURE_K;
	const rho = input.packingDensity ?? 0.76;
	const kT = BOLTZMANN_EV_PER_K * t;
	const em = new Map(input.centres.map((c) => [c.id, c.emMv]));
	const coupling = input.coupling ?? defaultChainCoupling(input.lambdaEv, t, rho);
	const warnings = new Set<string>();
	const hops = input.hops.map((h): HopRates => {
		const deltaGEv = deltaGFromPotentials(em.get(h.from)!, em.get(h.to)!);
		const downhill = -Math.abs(deltaGEv);
		let rate: RateResult;
		if (input.model === 'moser-dutton') {
			rate = moserDuttonLog10Rate({
				edgeDistanceA: h.edgeDistanceA,
				deltaGEv: downhill,
				lambdaEv: input.lambdaEv,
				packingDensity: rho
			});
		} else {
			const couplingEv = couplingAtDistance({ ...coupling, distanceA: h.edgeDistanceA });
			rate = marcusRate({
				couplingEv,
				deltaGEv: downhill,
				lambdaEv: input.lambdaEv,
				temperatureK: t
			});
		}
		for (const w of rate.warnings) warnings.add(`${h.from} → ${h.to}: ${w}`);
		const down = rate.rate;
		const up = down * Math.exp(downhill / kT);
		return deltaGEv <= 0
			? { from: h.from, to: h.to, forwardRate: down, backwardRate: up, deltaGEv }
			: { from: h.from, to: h.to, forwardRate: up, backwardRate: down, deltaGEv };
	});
	const ids = input.centres.map((c) => c.id);
	return { ids, index: new Map(ids.map((id, i) => [id, i])), hops, warnings: [...warnings] };
}

/** Centres reachable from `start` through hops whose rates are not zero. */
function reachable(chain: PreparedChain, start: string): Set<string> {
	const seen = new Set([start]);
	const queue = [start];
	while (queue.length > 0) {
		const node = queue.pop()!;
		for (const h of chain.hops) {
			const next =
				h.from === node && h.forwardRate > 0
					? h.to
					: h.to === node && h.backwardRate > 0
						? h.from
						: null;
			if (next !== null && !seen.has(next)) {
				seen.add(next);
				queue.push(next);
			}
		}
	}
	return seen;
}

/**
 * Mean first-passage time from entry to exit by state reduction without subtraction (the
 * Grassmann–Taksar–Heyman idea): eliminating a state adds its paths to the others' rates, and
 * every diagonal is rebuilt as a sum of positive rates rather than a difference. Hop rates in one
 * chain can span twenty decades, where ordinary Gaussian elimination loses the slow rates to
 * cancellation.
 * References: W. K. Grassmann, M. I. Taksar & D. P. Heyman, Oper. Res. 33, 1107 (1985);
 * D. P. Heyman & A. Reeves, ORSA J. Comput. 1, 52 (1989).
 */
function meanFirstPassage(
	chain: PreparedChain,
	entry: string,
	exit: string,
	scale?: number[]
): number {
	const component = reachable(chain, entry);
	if (!component.has(exit)) {
		throw new RangeError(
			`exit "${exit}" cannot be reached from entry "${entry}": no chain of hops joins them`
		);
	}
	// Entry first, so that it is the state left when all others are eliminated.
	const states = [entry, ...[...component].filter((id) => id !== exit && id !== entry)];
	const index = new Map(states.map((id, i) => [id, i]));
	const n = states.length;
	const k = new Float64Array(n * n); // rates between transient states
	const toExit = new Float64Array(n);
	const time = new Float64Array(n).fill(1);
	chain.hops.forEach((h, hop) => {
		const f = scale?.[hop] ?? 1;
		for (const [src, dst, rate] of [
			[h.from, h.to, h.forwardRate * f],
			[h.to, h.from, h.backwardRate * f]
		] as const) {
			const i = index.get(src);
			if (i === undefined) continue;
			if (dst === exit) toExit[i] = toExit[i]! + rate;
			else {
				const j = index.get(dst);
				if (j !== undefined) k[i * n + j] = k[i * n + j]! + rate;
			}
		}
	});
	const blocked = () =>
		new RangeError(
			'the chain is effectively blocked: its transit time cannot be computed (a hop rate underflows)'
		);
	for (let m = n - 1; m >= 1; m--) {
		let out = toExit[m]!;
		for (let j = 0; j < m; j++) out += k[m * n + j]!;
		if (!(out > 0)) throw blocked();
		for (let i = 0; i < m; i++) {
			const into = k[i * n + m]!;
			if (into === 0) continue;
			const f = into / out;
			for (let j = 0; j < m; j++) if (j !== i) k[i * n + j] = k[i * n + j]! + f * k[m * n + j]!;
			toExit[i] = toExit[i]! + f * toExit[m]!;
			time[i] = time[i]! + f * time[m]!;
		}
	}
	const tau = time[0]! / toExit[0]!;
	if (!Number.isFinite(tau) || tau <= 0) throw blocked();
	return tau;
}

/**
 * Hop rates, mean transit time, throughput, sensitivities and the rate-limiting hop of a chain.
 * @throws {RangeError} for unknown or duplicate centres, entry = exit, a disconnected exit,
 * λ ≤ 0 or T ≤ 0.
 * @example analyseChain({ centres: [{ id: 'A', emMv: -300 }, { id: 'B', emMv: -250 }],
 *   hops: [{ from: 'A', to: 'B', edgeDistanceA: 8 }], entry: 'A', exit: 'B',
 *   lambdaEv: 0.7, model: 'moser-dutton' }).throughputPerS // = the A → B rate
 */
export function analyseChain(input: ChainInput): ChainResult {
	validate(input);
	const chain = prepare(input);
	const tau = meanFirstPassage(chain, input.entry, input.exit);
	// Central differences in ln k (step 1e-4): exact to ~1e-8, and robust wherever τ is.
	const step = 1e-4;
	const sensitivities = chain.hops.map((h, hop): Sensitivity => {
		const scaled = (factor: number) =>
			meanFirstPassage(
				chain,
				input.entry,
				input.exit,
				chain.hops.map((_, i) => (i === hop ? factor : 1))
			);
		const value =
			-(Math.log(scaled(Math.exp(step))) - Math.log(scaled(Math.exp(-step)))) / (2 * step);
		return { from: h.from, to: h.to, value: Math.abs(value) < 1e-9 ? 0 : value };
	});
	const limiting = sensitivities.reduce((best, s) => (s.value > best.value ? s : best));
	return {
		hops: chain.hops,
		meanTransitTimeS: tau,
		throughputPerS: 1 / tau,
		rateLimitingHop: { from: limiting.from, to: limiting.to },
		sensitivities,
		warnings: chain.warnings
	};
}

export interface MonteCarloResult {
	samples: number;
	seed: number;
	throughputPerS: { p5: number; p50: number; p95: number };
	meanTransitTimeS: { p5: number; p50: number; p95: number };
	/** Samples whose chain was blocked (transit time not computable), left out of the percentiles. */
	blocked: number;
}

/**
 * Propagates the uncertainties of the potentials (emSigmaMv) and distances (edgeSigmaA) to the
 * throughput by Monte Carlo: each sample draws every Em and distance from a normal distribution
 * (distances truncated at 0 Å) and solves the chain. Reproducible for a given seed.
 * @throws {RangeError} for samples outside 10–100 000, or any analyseChain error.
 */
export function monteCarloChain(
	input: ChainInput,
	options: { samples: number; seed: number }
): MonteCarloResult {
	validate(input);
	const { samples, seed } = options;
	if (!Number.isInteger(samples) || samples < 10 || samples > 100_000) {
		throw new RangeError(`samples must be a whole number from 10 to 100000, got ${samples}`);
	}
	const random = seededRandom(seed);
	const throughputs: number[] = [];
	const transit: number[] = [];
	let blocked = 0;
	for (let s = 0; s < samples; s++) {
		const drawn: ChainInput = {
			...input,
			centres: input.centres.map((c) => ({
				...c,
				emMv: c.emMv + (c.emSigmaMv ?? 0) * random.normal()
			})),
			hops: input.hops.map((h) => ({
				...h,
				edgeDistanceA: Math.max(0, h.edgeDistanceA + (h.edgeSigmaA ?? 0) * random.normal())
			}))
		};
		try {
			const tau = meanFirstPassage(prepare(drawn), input.entry, input.exit);
			transit.push(tau);
			throughputs.push(1 / tau);
		} catch (e) {
			if (!(e instanceof RangeError)) throw e;
			blocked++;
		}
	}
	if (throughputs.length === 0) throw new RangeError('every sample of the chain was blocked');
	const summary = (values: number[]) => ({
		p5: percentile(values, 5),
		p50: percentile(values, 50),
		p95: percentile(values, 95)
	});
	return {
		samples,
		seed,
		throughputPerS: summary(throughputs),
		meanTransitTimeS: summary(transit),
		blocked
	};
}
