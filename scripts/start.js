// `npm start`: the production server (adapter-node's build) with the process settings of
// scripts/serverArgs.js. Configuration is read from the environment (src/lib/server/config.ts).
import { spawn } from 'node:child_process';
import { serverArgs } from './serverArgs.js';

const server = spawn(process.execPath, serverArgs(), {
	stdio: 'inherit',
	// The app enforces its own body limits (src/lib/server/requestLimits.ts).
	env: { BODY_SIZE_LIMIT: 'Infinity', ...process.env }
});
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => server.kill(signal));
server.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
