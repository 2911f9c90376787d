// Zod compiles fast object parsers with `new Function` where it may, and probes for that on the
// first parse. The pages' Content-Security-Policy forbids eval, so the probe would be reported
// as a violation on every page that parses a form; in the browser Zod parses small forms only,
// so its plain path costs nothing noticeable. (The server keeps the compiled path.)
//
// Zod 4 keeps its configuration in `globalThis.__zod_globalConfig` and adopts an object already
// there (zod/v4/core/core.js), so the setting is made without importing Zod: `z.config()` here
// would put Zod's core (4 kB gzipped) into the start-up code of every page, most of which never
// parse anything. tests/unit/zodConfig.test.ts checks that Zod still reads this object.
const holder = globalThis as { __zod_globalConfig?: { jitless?: boolean } };
holder.__zod_globalConfig ??= {};
holder.__zod_globalConfig.jitless = true;

export {};
