// How the server process is started, in one place: `npm start`, `npm run demo`, the HTTP and
// browser tests and the benchmarks all use it.
//
// V8 grows its heap lazily up to a limit set from the machine's memory (gigabytes here), so a
// server that renders pages all day holds hundreds of megabytes of garbage between collections.
// A fixed old-space limit makes it collect instead: with 100 000 potentials the server stays
// near 270 MB instead of 430–550 MB (bench/RESULTS.md, "http"), and 200 MB was still enough.
// Large catalogues may need more: set HOPLINE_HEAP_MB.
export const HEAP_MB = Number(process.env.HOPLINE_HEAP_MB ?? 256);

/** Node's arguments for running the adapter-node build at `entry`. */
export function serverArgs(entry = 'build') {
	if (!Number.isInteger(HEAP_MB) || HEAP_MB < 64)
		throw new Error(`HOPLINE_HEAP_MB must be a whole number of megabytes ≥ 64, not ${HEAP_MB}`);
	return [`--max-old-space-size=${HEAP_MB}`, entry];
}
