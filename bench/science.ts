// Science-engine timings for `npm run bench`: figures printed, never asserted.
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import {
	analyseChain,
	fitNernst,
	monteCarloChain,
	nernstFractionReduced,
	adaptiveVibrationalLevels,
	bellKappaLog10,
	seededRandom,
	vibrationalLevels,
	type ChainInput
} from '../src/lib/science';
import { ATOMIC_MASS_KG, AVOGADRO_PER_MOL, HBAR_J_S } from '../src/lib/science/constants';
import { MAX_GRID_POINTS } from '../src/lib/schemas/calc';
import { lowestEigenpairs } from '../src/lib/science/symmetricEigen';

function medianMs(runs: number, f: () => unknown): number {
	f(); // warm up the JIT
	const times: number[] = [];
	for (let i = 0; i < runs; i++) {
		const start = performance.now();
		f();
		times.push(performance.now() - start);
	}
	times.sort((a, b) => a - b);
	return times[Math.floor(times.length / 2)]!;
}

function time(label: string, target: string, runs: number, f: () => unknown): void {
	const median = medianMs(runs, f);
	console.log(
		`  ${label.padEnd(44)} median ${median.toFixed(2).padStart(8)} ms  (target ${target}, ${runs} runs)`
	);
}

/**
 * The Colbert–Miller DVR Hamiltonian (kcal/mol) of a proton in a symmetric double well with a
 * barrier of 8 kcal/mol, on `points` grid points over ±1 Å: the matrix vibrationalLevels builds.
 */
function dvrHamiltonian(points: number): Float64Array[] {
	const dx = 2 / (points + 1);
	const kinetic =
		((HBAR_J_S ** 2 / (2 * 1.00782503 * ATOMIC_MASS_KG * (dx * 1e-10) ** 2)) * AVOGADRO_PER_MOL) /
		4184;
	return Array.from({ length: points }, (_, i) => {
		const x = -1 + (i + 1) * dx;
		const row = new Float64Array(points);
		for (let j = 0; j < points; j++) {
			const k = i - j;
			row[j] =
				k === 0
					? kinetic * (Math.PI ** 2 / 3) + 8 * ((x / 0.35) ** 2 - 1) ** 2
					: (kinetic * 2 * (k % 2 === 0 ? 1 : -1)) / (k * k);
		}
		return row;
	});
}

/**
 * The lowest levels of DVR Hamiltonians by our solver (symmetricEigen.ts: Householder, bisection,
 * inverse iteration) and by ml-matrix's EigenvalueDecomposition (the full spectrum with vectors),
 * at the grid sizes the calculator allows (default 400, at most MAX_GRID_POINTS) and its level
 * counts (default 6, at most 20); with the largest difference between their eigenvalues.
 */
function benchEigenSolvers(): void {
	console.log(
		'\nDVR eigenvalues: symmetricEigen.ts (lowest k) against ml-matrix EigenvalueDecomposition (all)'
	);
	for (const [points, levels] of [
		[100, 6],
		[400, 6],
		[400, 20],
		[MAX_GRID_POINTS, 6],
		[MAX_GRID_POINTS, 20]
	] as const) {
		const h = dvrHamiltonian(points);
		const runs = points > 400 ? 3 : 5;
		const ours = lowestEigenpairs(h, levels).values;
		const theirs = new EigenvalueDecomposition(new Matrix(h.map((row) => Array.from(row))), {
			assumeSymmetric: true
		}).realEigenvalues.slice(0, levels);
		const maxDiff = Math.max(...ours.map((v, i) => Math.abs(v - theirs[i]!)));
		const oursMs = medianMs(runs, () => lowestEigenpairs(h, levels));
		const theirsMs = medianMs(
			runs,
			() =>
				new EigenvalueDecomposition(new Matrix(h.map((row) => Array.from(row))), {
					assumeSymmetric: true
				})
		);
		console.log(
			`  ${`${points} points, ${levels} levels`.padEnd(22)} ours ${oursMs.toFixed(1).padStart(7)} ms  ml-matrix ${theirsMs.toFixed(1).padStart(7)} ms  (×${(theirsMs / oursMs).toFixed(1)})  max |ΔE| ${maxDiff.toExponential(1)} kcal/mol (E up to ${ours[levels - 1]!.toFixed(1)})  ${runs} runs`
		);
	}
}

export function benchScience(): void {
	const random = seededRandom(2024);
	const chain: ChainInput = {
		centres: Array.from({ length: 40 }, (_, i) => ({
			id: `C${i}`,
			emMv: -400 + 10 * i + 60 * (random.uniform() - 0.5),
			emSigmaMv: 20
		})),
		hops: Array.from({ length: 39 }, (_, i) => ({
			from: `C${i}`,
			to: `C${i + 1}`,
			edgeDistanceA: 6 + 6 * random.uniform(),
			edgeSigmaA: 0.3
		})),
		entry: 'C0',
		exit: 'C39',
		lambdaEv: 0.7,
		temperatureK: 298.15,
		model: 'moser-dutton'
	};
	const points = Array.from({ length: 200 }, (_, i) => {
		const e = -600 + i * 3;
		return {
			potentialMv: e,
			signal:
				0.7 * nernstFractionReduced(e, -380, 1) +
				0.3 * nernstFractionReduced(e, -250, 1) +
				0.01 * random.normal()
		};
	});
	console.log('\nScience engine');
	time('analyseChain, 40 centres (with sensitivities)', '≤ 5 ms', 20, () => analyseChain(chain));
	time('monteCarloChain, 40 centres, 10 000 samples', '≤ 1 s', 3, () =>
		monteCarloChain(chain, { samples: 10_000, seed: 1 })
	);
	time('fitNernst, 200 points, 2 components, n fixed', '≤ 20 ms', 20, () =>
		fitNernst(points, { components: 2, n: 1 })
	);
	time('fitNernst, 200 points, 1 component, n free', '≤ 20 ms', 20, () =>
		fitNernst(points, { components: 1 })
	);
	// 90 starts (Em pairs × n pairs): the dearest titration fit; the target is ours, a fraction of
	// a second well inside the calculators' 10 s limit.
	time('fitNernst, 200 points, 2 components, n free', '≤ 500 ms', 5, () =>
		fitNernst(points, { components: 2 })
	);
	time('vibrationalLevels, 400 points, 6 levels', '≤ 300 ms', 5, () =>
		vibrationalLevels({
			potential: (x) => 8 * ((x / 0.35) ** 2 - 1) ** 2,
			massAmu: 1.00782503,
			xMinA: -1,
			xMaxA: 1,
			points: 400,
			levels: 6
		})
	);
	// The calculator's grid chosen from the potential (its default well, and 20 levels), and
	// Bell's truncated factor far below the crossover temperature (10^408).
	const well = (x: number) => 6 * ((x / 0.35) ** 2 - 1) ** 2;
	for (const levels of [6, 20]) {
		time(`adaptiveVibrationalLevels, ${levels} levels`, '≤ 300 ms', 5, () =>
			adaptiveVibrationalLevels({
				potential: well,
				massAmu: 1.00782503,
				levels,
				xMinA: -0.7,
				xMaxA: 0.7,
				maxPoints: MAX_GRID_POINTS
			})
		);
	}
	time('bellKappaLog10, 50 K, 500 kJ/mol, 1000 cm⁻¹', '≤ 5 ms', 20, () =>
		bellKappaLog10(1000, 50, 500)
	);
	benchEigenSolvers();
}
