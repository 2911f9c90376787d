import fc from 'fast-check';

// Property tests draw from a fixed seed so that CI is reproducible; set FAST_CHECK_SEED to explore
// other inputs locally (a failure prints the seed and the shrunk counterexample).
fc.configureGlobal({ seed: Number(process.env.FAST_CHECK_SEED ?? 20261202) });
