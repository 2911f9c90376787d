// Science-engine timings for `npm run bench`: figures printed, never asserted.
import {
	analyseChain,
	fitNernst,
	monteCarloChain,
	nernstFractionReduced,
	seededRandom,
	vibrationalLevels,
	type ChainInput
} from '../src/lib/science';

function time(label: string, target: string, runs: number, f: () => unknown): void {
	f(); // warm up the JIT
	const times: number[] = [];
	for (let i = 0; i < runs; i++) {
		const start = performance.now();
		f();
		times.push(performance.now() - start);
	}
	times.sort((a, b) => a - b);
	const median = times[Math.floor(times.length / 2)]!;
	console.log(
		`  ${label.padEnd(44)} median ${median.toFixed(2).padStart(8)} ms  (target ${target}, ${runs} runs)`
	);
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
}
