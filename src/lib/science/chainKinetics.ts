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
	detailedBalanceDecades,
	marcusRate,
	moserDuttonLog10Rate,
	type RateResult
} from './electronTransfer';
import { requireFinite, requireInRange, requirePositive } from './guards';
import { percentiles, seededRandom } from './random';
import { truncatedNormalSampler } from './truncatedNormal';

/*
 * Kinetics of one electron crossing a network of redox centres.
 *
 * Model: one electron at a time hops between centres; every hop is reversible, its downhill
 * direction given by the chosen rate model and its uphill direction by detailed balance at the
 * stated temperature (k_up = k_down · exp(−|ΔG°|/k_BT)). The exit centre is absorbing (drained
 * at once) and the entry is refilled at once, so the steady throughput is 1 / (mean first-passage
 * time from entry to exit). The mean first-passage times τ solve, for every centre i the electron
 * can reach from the entry without passing the exit,
 *
 *   Σ_j k_ij (τ_i − τ_j) = 1,   τ_exit = 0
 *
 * References: N. G. van Kampen, *Stochastic Processes in Physics and Chemistry* (3rd ed., 2007),
 * §XII.2 (first-passage times of master equations); hop rates as in electronTransfer.ts; the
 * solution by subtraction-free state reduction carried in logarithms (see logTransitTime).
 * Works for any connected graph (branches and loops), not only linear chains.
 *
 * Ranges. Potentials must lie within ±EM_LIMIT_MV: no redox couple of a protein cofactor lies
 * outside about ±1 V vs SHE, and water itself is oxidised above +0.82 V and reduced below −0.41 V
 * at pH 7 (E° = 1.229 V for O₂/H₂O); ±2 V is the registry's own bound on stored potentials
 * (schemas/potential.ts), so a value beyond it is a typing or unit error (30 000 mV for 30 mV),
 * not chemistry. Rates are carried as logarithms throughout, so a hop of 10⁻⁵⁰⁰ s⁻¹ is neither
 * lost to underflow nor allowed to hide a trap: before, a centre at +30 V (in-rate and out-rate
 * both underflowing to 0) was dropped from the network and the chain reported a 1.6 ns transit,
 * or an unconnected exit. Connection is a property of the hops given, never of the rates.
 */

export type ChainModel = 'moser-dutton' | 'marcus';

/** Potentials beyond ±2 V vs SHE are refused (see the module comment). */
export const EM_LIMIT_MV = 2000;
/** Edge-to-edge distances are accepted from 0 to 100 Å (the ruler is calibrated to ~25 Å). */
export const CHAIN_MAX_DISTANCE_A = 100;
/**
 * Transit times above 10³⁰⁰ s (and rates below 10⁻³⁰⁰ s⁻¹) are not given as numbers: the chain
 * is reported as blocked, with the logarithm of its transit time.
 */
export const LOG10_TRANSIT_LIMIT = 300;

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
	/** from → to, s⁻¹ (0 when below 10⁻³⁰⁰ s⁻¹: see log10ForwardRate). */
	forwardRate: number;
	/** to → from, s⁻¹ (0 when below 10⁻³⁰⁰ s⁻¹: see log10BackwardRate). */
	backwardRate: number;
	log10ForwardRate: number;
	log10BackwardRate: number;
	/** Driving force of from → to, eV (negative downhill). */
	deltaGEv: number;
}

export interface Sensitivity {
	from: string;
	to: string;
	/**
	 * d ln(throughput) / d ln(k) when both directions of the hop are scaled together (so its
	 * equilibrium constant, fixed by the potentials, stays as it is).
	 */
	value: number;
}

export interface ChainResult {
	hops: HopRates[];
	/** Mean first-passage time from entry to exit, s; null when the chain is blocked. */
	meanTransitTimeS: number | null;
	log10MeanTransitTimeS: number;
	/** 1 / meanTransitTimeS, s⁻¹; 0 when the chain is blocked. */
	throughputPerS: number;
	/** The transit time exceeds 10³⁰⁰ s: no throughput to speak of (an electron is trapped). */
	blocked: boolean;
	rateLimitingHop: { from: string; to: string };
	sensitivities: Sensitivity[];
	/** Centres the electron can visit on its way (reachable from the entry without the exit). */
	visited: string[];
	warnings: string[];
}

/** The hops as a graph, fixed for one entry and exit whatever the rates. */
interface Network {
	ids: string[];
	/** Transient states as centre indices: the entry first, then by hop count from it. */
	states: number[];
	/** Centre index → state index; −1 for the exit and centres the electron cannot reach. */
	stateOf: Int32Array;
	exit: number;
	hopFrom: Int32Array;
	hopTo: Int32Array;
}

/** Natural-log rates of each hop's two directions, and what the page shows of them. */
interface Rates {
	lnForward: Float64Array;
	lnBackward: Float64Array;
	deltaGEv: Float64Array;
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
		if (Math.abs(c.emMv) > EM_LIMIT_MV) {
			throw new RangeError(
				`emMv of ${c.id} is ${c.emMv} mV, outside ±${EM_LIMIT_MV} mV vs SHE: no cofactor couple lies there (a unit or typing error?)`
			);
		}
		if (c.emSigmaMv !== undefined) requireInRange(c.emSigmaMv, `emSigmaMv of ${c.id}`, 0, 1000);
	}
	for (const h of input.hops) {
		for (const end of [h.from, h.to]) {
			if (!ids.has(end))
				throw new RangeError(`hop ${h.from} → ${h.to} names unknown centre "${end}"`);
		}
		if (h.from === h.to) throw new RangeError(`hop ${h.from} → ${h.to} joins a centre to itself`);
		requireInRange(
			h.edgeDistanceA,
			`edgeDistanceA of ${h.from} → ${h.to}`,
			0,
			CHAIN_MAX_DISTANCE_A
		);
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
	if (input.coupling) {
		requirePositive(input.coupling.h0Ev, 'coupling.h0Ev');
		requireFinite(input.coupling.betaPerA, 'coupling.betaPerA');
	}
}

/**
 * The centres the electron can reach from the entry through the hops given (rates play no part),
 * without passing the absorbing exit, in order of hop count. Throws when the exit is not among
 * them: only then does no chain of hops join entry and exit.
 */
function network(input: ChainInput): Network {
	const ids = input.centres.map((c) => c.id);
	const index = new Map(ids.map((id, i) => [id, i]));
	const hopFrom = Int32Array.from(input.hops, (h) => index.get(h.from)!);
	const hopTo = Int32Array.from(input.hops, (h) => index.get(h.to)!);
	const neighbours: number[][] = ids.map(() => []);
	hopFrom.forEach((a, h) => {
		neighbours[a]!.push(hopTo[h]!);
		neighbours[hopTo[h]!]!.push(a);
	});
	const entry = index.get(input.entry)!;
	const exit = index.get(input.exit)!;
	const stateOf = new Int32Array(ids.length).fill(-1);
	const states = [entry];
	stateOf[entry] = 0;
	let exitReached = false;
	for (let head = 0; head < states.length; head++) {
		for (const next of neighbours[states[head]!]!) {
			if (next === exit) exitReached = true;
			else if (stateOf[next] === -1) {
				stateOf[next] = states.length;
				states.push(next);
			}
		}
	}
	if (!exitReached) {
		throw new RangeError(
			`exit "${input.exit}" cannot be reached from entry "${input.entry}": no chain of hops joins them`
		);
	}
	return { ids, states, stateOf, exit, hopFrom, hopTo };
}

/**
 * Rates of every hop in both directions, as natural logarithms (never underflowing). Monte Carlo
 * samples skip the model warnings (`withWarnings` false): the central estimate reports them.
 */
function hopRates(
	input: ChainInput,
	net: Network,
	emMv: Float64Array,
	distanceA: Float64Array,
	withWarnings = true
) {
	const t = input.temperatureK ?? STANDARD_TEMPERATURE_K;
	const rho = input.packingDensity ?? 0.76;
	const coupling = input.coupling ?? defaultChainCoupling(input.lambdaEv, t, rho);
	const n = net.hopFrom.length;
	const rates: Rates = {
		lnForward: new Float64Array(n),
		lnBackward: new Float64Array(n),
		deltaGEv: new Float64Array(n),
		warnings: []
	};
	const warnings = new Set<string>();
	for (let h = 0; h < n; h++) {
		const deltaGEv = deltaGFromPotentials(emMv[net.hopFrom[h]!]!, emMv[net.hopTo[h]!]!);
		const downhill = -Math.abs(deltaGEv);
		const r = distanceA[h]!;
		let rate: RateResult;
		if (input.model === 'moser-dutton') {
			rate = moserDuttonLog10Rate({
				edgeDistanceA: r,
				deltaGEv: downhill,
				lambdaEv: input.lambdaEv,
				packingDensity: rho
			});
		} else {
			const couplingEv = couplingAtDistance({ ...coupling, distanceA: r });
			rate = marcusRate({
				couplingEv,
				deltaGEv: downhill,
				lambdaEv: input.lambdaEv,
				temperatureK: t
			});
		}
		if (withWarnings && rate.warnings.length > 0) {
			const label = `${net.ids[net.hopFrom[h]!]} → ${net.ids[net.hopTo[h]!]}`;
			for (const w of rate.warnings) warnings.add(`${label}: ${w}`);
		}
		const lnDown = rate.log10Rate * Math.LN10;
		// The one uphill rule of the science layer: detailed balance at the stated T.
		const lnUp = lnDown - detailedBalanceDecades(downhill, t) * Math.LN10;
		rates.deltaGEv[h] = deltaGEv;
		rates.lnForward[h] = deltaGEv <= 0 ? lnDown : lnUp;
		rates.lnBackward[h] = deltaGEv <= 0 ? lnUp : lnDown;
	}
	rates.warnings = [...warnings];
	return rates;
}

/** ln(eᵃ + eᵇ) without overflow or underflow; −∞ stands for a zero rate. */
function logAdd(a: number, b: number): number {
	if (a === -Infinity) return b;
	if (b === -Infinity) return a;
	return a > b ? a + Math.log1p(Math.exp(b - a)) : b + Math.log1p(Math.exp(a - b));
}

/** Buffers of one size, reused across the many solves of one analysis. */
class Workspace {
	readonly k: Float64Array;
	readonly toExit: Float64Array;
	readonly time: Float64Array;
	readonly neighbours: number[][];
	constructor(readonly n: number) {
		this.k = new Float64Array(n * n);
		this.toExit = new Float64Array(n);
		this.time = new Float64Array(n);
		this.neighbours = Array.from({ length: n }, () => []);
	}
}

/**
 * ln of the mean first-passage time from entry to exit, by state reduction without subtraction
 * (the Grassmann–Taksar–Heyman idea): eliminating a state adds its paths to the others' rates, and
 * every diagonal is rebuilt as a sum of positive rates rather than a difference. Hop rates in one
 * chain can span twenty decades, where ordinary Gaussian elimination loses the slow rates to
 * cancellation. Only sums, products and quotients of positive numbers occur, so the whole
 * reduction is carried in logarithms (sums by log-add): no rate underflows, however slow, and
 * no product overflows, however strongly a centre traps. States are eliminated farthest from the
 * entry first (leaves of a tree first, so a tree never fills in).
 * References: W. K. Grassmann, M. I. Taksar & D. P. Heyman, Oper. Res. 33, 1107 (1985);
 * D. P. Heyman & A. Reeves, ORSA J. Comput. 1, 52 (1989).
 */
function logTransitTime(
	net: Network,
	rates: Rates,
	ws: Workspace,
	scaledHop = -1,
	lnScale = 0
): number {
	const n = ws.n;
	const { k, toExit, time, neighbours } = ws;
	k.fill(-Infinity);
	toExit.fill(-Infinity);
	time.fill(0); // ln 1: one unit of time per visit, before scaling by the exit rates
	for (const list of neighbours) list.length = 0;
	const link = (src: number, dst: number, lnRate: number) => {
		const i = net.stateOf[src]!;
		if (i < 0) return; // out of the exit (absorbing) or of a centre never reached
		if (dst === net.exit) toExit[i] = logAdd(toExit[i]!, lnRate);
		else {
			const j = net.stateOf[dst]!;
			if (k[i * n + j] === -Infinity) neighbours[i]!.push(j);
			k[i * n + j] = logAdd(k[i * n + j]!, lnRate);
		}
	};
	for (let h = 0; h < net.hopFrom.length; h++) {
		const s = h === scaledHop ? lnScale : 0;
		link(net.hopFrom[h]!, net.hopTo[h]!, rates.lnForward[h]! + s);
		link(net.hopTo[h]!, net.hopFrom[h]!, rates.lnBackward[h]! + s);
	}
	// Every hop joins its two centres both ways, so the neighbours of m are also the states that
	// lead into m; states above m are already eliminated.
	for (let m = n - 1; m >= 1; m--) {
		const live = neighbours[m]!.filter((j) => j < m);
		let top = toExit[m]!;
		for (const j of live) top = Math.max(top, k[m * n + j]!);
		let sum = Math.exp(toExit[m]! - top);
		for (const j of live) sum += Math.exp(k[m * n + j]! - top);
		const out = top + Math.log(sum);
		for (const i of live) {
			const f = k[i * n + m]! - out; // the share of i's flow into m, per unit of m's outflow
			for (const j of live) {
				if (j === i) continue;
				if (k[i * n + j] === -Infinity) neighbours[i]!.push(j);
				k[i * n + j] = logAdd(k[i * n + j]!, f + k[m * n + j]!);
			}
			toExit[i] = logAdd(toExit[i]!, f + toExit[m]!);
			time[i] = logAdd(time[i]!, f + time[m]!);
		}
	}
	return time[0]! - toExit[0]!;
}

const describeRate = (log10: number) => (log10 >= -LOG10_TRANSIT_LIMIT ? 10 ** log10 : 0);

/**
 * Hop rates, mean transit time, throughput, sensitivities and the rate-limiting hop of a chain.
 * A chain whose transit time exceeds 10³⁰⁰ s is reported as blocked (throughput 0, the transit
 * time as its logarithm), never as a wrong finite number.
 * @throws {RangeError} for unknown or duplicate centres, a potential outside ±2 V, entry = exit,
 * an exit no chain of hops reaches, λ ≤ 0 or T ≤ 0.
 * @example analyseChain({ centres: [{ id: 'A', emMv: -300 }, { id: 'B', emMv: -250 }],
 *   hops: [{ from: 'A', to: 'B', edgeDistanceA: 8 }], entry: 'A', exit: 'B',
 *   lambdaEv: 0.7, model: 'moser-dutton' }).throughputPerS // = the A → B rate
 */
export function analyseChain(input: ChainInput): ChainResult {
	validate(input);
	const net = network(input);
	const rates = hopRates(
		input,
		net,
		Float64Array.from(input.centres, (c) => c.emMv),
		Float64Array.from(input.hops, (h) => h.edgeDistanceA)
	);
	const ws = new Workspace(net.states.length);
	const lnTau = logTransitTime(net, rates, ws);
	// Central differences in ln k (step 1e-4): exact to ~1e-8, and robust wherever τ is.
	const step = 1e-4;
	const sensitivities = input.hops.map((h, hop): Sensitivity => {
		const value =
			-(logTransitTime(net, rates, ws, hop, step) - logTransitTime(net, rates, ws, hop, -step)) /
			(2 * step);
		return { from: h.from, to: h.to, value: Math.abs(value) < 1e-9 ? 0 : value };
	});
	const limiting = sensitivities.reduce((best, s) => (s.value > best.value ? s : best));
	const log10Tau = lnTau / Math.LN10;
	const blocked = log10Tau > LOG10_TRANSIT_LIMIT;
	const hops = input.hops.map((h, i): HopRates => {
		const log10ForwardRate = rates.lnForward[i]! / Math.LN10;
		const log10BackwardRate = rates.lnBackward[i]! / Math.LN10;
		return {
			from: h.from,
			to: h.to,
			forwardRate: describeRate(log10ForwardRate),
			backwardRate: describeRate(log10BackwardRate),
			log10ForwardRate,
			log10BackwardRate,
			deltaGEv: rates.deltaGEv[i]!
		};
	});
	const warnings = [...rates.warnings];
	const visited = new Set(net.states.map((s) => net.ids[s]!));
	const tiny = hops.filter(
		(h) =>
			(visited.has(h.from) || visited.has(h.to)) &&
			Math.min(h.log10ForwardRate, h.log10BackwardRate) < -LOG10_TRANSIT_LIMIT
	);
	if (tiny.length > 0) {
		warnings.push(
			`Rates below 10⁻³⁰⁰ s⁻¹ (${tiny
				.map((h) => `${h.from} ⇄ ${h.to}`)
				.join(', ')}) are shown as 0 but were carried in the calculation as logarithms.`
		);
	}
	if (blocked) {
		warnings.push(
			`The chain is blocked: the mean transit time is about 10^${Math.round(log10Tau)} s, so no electron gets through (an electron is trapped or a hop is practically forbidden).`
		);
	}
	return {
		hops,
		meanTransitTimeS: blocked ? null : Math.exp(lnTau),
		log10MeanTransitTimeS: log10Tau,
		throughputPerS: blocked ? 0 : Math.exp(-lnTau),
		blocked,
		rateLimitingHop: { from: limiting.from, to: limiting.to },
		sensitivities,
		visited: [...visited],
		warnings
	};
}

/** Percentiles of a sample; null where a percentile falls among values not representable. */
export interface Percentiles<T> {
	p5: T;
	p50: T;
	p95: T;
}

export interface MonteCarloResult {
	samples: number;
	seed: number;
	/** Blocked samples count as throughput 0. */
	throughputPerS: Percentiles<number>;
	/** Blocked samples count as an infinite transit time: a percentile among them is null. */
	meanTransitTimeS: Percentiles<number | null>;
	/** Samples whose chain was blocked (transit time above 10³⁰⁰ s); counted, not dropped. */
	blocked: number;
	blockedFraction: number;
	/** Centres whose potential was held fixed: no uncertainty was given for them. */
	fixedCentres: string[];
	/** Hops whose distance was held fixed: no uncertainty was given for them. */
	fixedHops: { from: string; to: string }[];
}

/** Where Monte Carlo draws are truncated: the ranges analyseChain accepts. */
export const MONTE_CARLO_BOUNDS = {
	emMv: [-EM_LIMIT_MV, EM_LIMIT_MV],
	edgeDistanceA: [0, CHAIN_MAX_DISTANCE_A]
} as const;

/**
 * Propagates the uncertainties of the potentials (emSigmaMv) and distances (edgeSigmaA) to the
 * throughput by Monte Carlo: each sample draws every Em and distance from a normal distribution
 * truncated to the range the model accepts (Em within ±2 V, distances within 0–100 Å; exact
 * draws by inversion, truncatedNormalSampler — no clamping, no redrawing) and solves the chain.
 * Blocked samples are kept in the percentiles (throughput 0) and counted. Values without an
 * uncertainty are held fixed and listed. Reproducible for a given seed.
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
	const net = network(input);
	const ws = new Workspace(net.states.length);
	const random = seededRandom(seed);
	const [emLow, emHigh] = MONTE_CARLO_BOUNDS.emMv;
	const [dLow, dHigh] = MONTE_CARLO_BOUNDS.edgeDistanceA;
	const em = Float64Array.from(input.centres, (c) => c.emMv);
	const distance = Float64Array.from(input.hops, (h) => h.edgeDistanceA);
	// One sampler per uncertain value (its bounds' tails computed once); the others stay fixed.
	const emDraws = input.centres.flatMap((c, i) =>
		(c.emSigmaMv ?? 0) > 0
			? [
					{
						i,
						draw: truncatedNormalSampler({
							mean: c.emMv,
							sigma: c.emSigmaMv!,
							lower: emLow,
							upper: emHigh
						})
					}
				]
			: []
	);
	const distanceDraws = input.hops.flatMap((h, i) =>
		(h.edgeSigmaA ?? 0) > 0
			? [
					{
						i,
						draw: truncatedNormalSampler({
							mean: h.edgeDistanceA,
							sigma: h.edgeSigmaA!,
							lower: dLow,
							upper: dHigh
						})
					}
				]
			: []
	);
	const log10Taus: number[] = [];
	for (let s = 0; s < samples; s++) {
		for (const { i, draw } of emDraws) em[i] = draw(random);
		for (const { i, draw } of distanceDraws) distance[i] = draw(random);
		log10Taus.push(logTransitTime(net, hopRates(input, net, em, distance, false), ws) / Math.LN10);
	}
	const isBlocked = (x: number) => x > LOG10_TRANSIT_LIMIT;
	const blocked = log10Taus.filter(isBlocked).length;
	const throughputs = log10Taus.map((x) => (isBlocked(x) ? 0 : 10 ** -x));
	// Blocked samples sort last; a percentile that needs one of them is not a number.
	const transits = log10Taus.map((x) => (isBlocked(x) ? Infinity : 10 ** x));
	const [t5, t50, t95] = percentiles(transits, [5, 50, 95]).map((t) =>
		Number.isFinite(t) ? t : null
	);
	const [q5, q50, q95] = percentiles(throughputs, [5, 50, 95]);
	return {
		samples,
		seed,
		throughputPerS: { p5: q5 as number, p50: q50 as number, p95: q95 as number },
		meanTransitTimeS: { p5: t5 ?? null, p50: t50 ?? null, p95: t95 ?? null },
		blocked,
		blockedFraction: blocked / samples,
		fixedCentres: input.centres.filter((c) => !((c.emSigmaMv ?? 0) > 0)).map((c) => c.id),
		fixedHops: input.hops
			.filter((h) => !((h.edgeSigmaA ?? 0) > 0))
			.map((h) => ({ from: h.from, to: h.to }))
	};
}
