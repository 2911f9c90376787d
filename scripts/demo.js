// `npm run demo`: builds the app, then serves it on an embedded SQLite file loaded with the
// invented demo scenario (migrated and seeded at start-up when empty), and prints the URL.
import { spawn, spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { serverArgs } from './serverArgs.js';

const port = process.env.PORT ?? '3000';
const host = process.env.HOST ?? '127.0.0.1';
const origin = process.env.ORIGIN ?? `http://${host === '0.0.0.0' ? '127.0.0.1' : host}:${port}`;

const build = spawnSync('npx', ['vite', 'build', '--logLevel', 'warn'], { stdio: 'inherit' });
if (build.status !== 0) process.exit(build.status ?? 1);

const server = spawn(process.execPath, serverArgs(), {
	stdio: ['ignore', 'inherit', 'inherit'],
	env: {
		...process.env,
		PORT: port,
		HOST: host,
		ORIGIN: origin,
		HOPLINE_DEMO: 'true',
		// The app enforces its own body limits (src/lib/server/requestLimits.ts).
		BODY_SIZE_LIMIT: 'Infinity',
		DATABASE_PATH: process.env.DATABASE_PATH ?? './data/demo.sqlite'
	}
});
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => server.kill(signal));
server.on('exit', (code) => process.exit(code ?? 0));

// Say where to go once the server answers.
for (let i = 0; i < 100; i++) {
	try {
		const res = await fetch(`${origin}/api/v1/facets`);
		if (res.ok) {
			console.log(`\nHopline demo is running at ${origin}  (Ctrl+C stops it)\n`);
			// Demo accounts exist only in demo mode (HOPLINE_DEMO); never use these anywhere else.
			const accounts = JSON.parse(
				readFileSync(new URL('../seed/demoAccounts.json', import.meta.url), 'utf8')
			);
			console.log('Demo accounts (sign in at /signin):');
			for (const a of accounts)
				console.log(`  ${a.role.padEnd(12)} ${a.email.padEnd(32)} ${a.password}`);
			console.log(
				'\nMail the app sends (confirmations, sign-in links, review notices) lands in a local\n' +
					'mailbox the admin reads at /admin/mail. "Continue with the demo institution" on\n' +
					'/signin goes to a local OpenID Connect provider that accepts any e-mail address.\n'
			);
			break;
		}
	} catch {
		// not listening yet
	}
	await new Promise((r) => setTimeout(r, 300));
}
