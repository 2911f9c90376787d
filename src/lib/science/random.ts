/*
 * A seeded, reproducible random source: mulberry32 for uniforms (T. Ettinger, public domain;
 * passes PractRand to 2^32 outputs — ample for Monte Carlo error propagation) and the
 * Box–Muller transform for standard normals (Box & Muller, Ann. Math. Stat. 29, 610 (1958)).
 * The same seed always gives the same sequence, on every platform.
 */
export interface RandomSource {
	uniform(): number;
	normal(): number;
}

export function seededRandom(seed: number): RandomSource {
	if (!Number.isInteger(seed)) throw new TypeError(`seed must be an integer, got ${seed}`);
	let state = seed >>> 0;
	let spare: number | null = null;
	const uniform = () => {
		state = (state + 0x6d2b79f5) >>> 0;
		let t = state;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
	const normal = () => {
		if (spare !== null) {
			const value = spare;
			spare = null;
			return value;
		}
		let u = 0;
		while (u === 0) u = uniform();
		const v = uniform();
		const radius = Math.sqrt(-2 * Math.log(u));
		spare = radius * Math.sin(2 * Math.PI * v);
		return radius * Math.cos(2 * Math.PI * v);
	};
	return { uniform, normal };
}

/**
 * The p-th percentile (0–100) of a sample by linear interpolation between order statistics
 * (Hyndman & Fan, Am. Stat. 50, 361 (1996), definition 7 — the default of R and NumPy).
 */
export function percentile(values: readonly number[], p: number): number {
	return percentiles(values, [p])[0] as number;
}

/** Several percentiles of one sample, sorting it once (same definition as `percentile`). */
export function percentiles(values: readonly number[], ps: readonly number[]): number[] {
	if (values.length === 0) throw new RangeError('percentile of an empty sample');
	for (const p of ps)
		if (!(p >= 0 && p <= 100)) throw new RangeError(`percentile must be within 0–100, got ${p}`);
	const sorted = [...values].sort((a, b) => a - b);
	return ps.map((p) => {
		const h = ((sorted.length - 1) * p) / 100;
		const lo = Math.floor(h);
		// An exact rank is the value itself (no 0·∞ when the sample holds infinities).
		if (h === lo) return sorted[lo]!;
		return sorted[lo]! + (h - lo) * (sorted[lo + 1]! - sorted[lo]!);
	});
}
