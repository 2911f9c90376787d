import { z } from 'zod';

// Zod compiles fast object parsers with `new Function` where it may, and probes for that on the
// first parse. The pages' Content-Security-Policy forbids eval, so the probe would be reported
// as a violation on every page that parses a form; in the browser Zod parses small forms only,
// so its plain path costs nothing noticeable. (The server keeps the compiled path.)
z.config({ jitless: true });
