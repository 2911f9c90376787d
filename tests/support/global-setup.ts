import { existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { startServer } from './server';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';

declare module 'vitest' {
	export interface ProvidedContext {
		baseUrl: string;
	}
}

/**
 * Starts the production build (adapter-node) on a fresh temporary SQLite file with the demo
 * scenario, for the HTTP and browser tests. `npm test` builds before it runs.
 */
export default async function setup(project: TestProject) {
	if (!existsSync('build/index.js'))
		throw new Error('No production build: run `npm run build` first.');
	mkdirSync('test-results', { recursive: true }); // screenshots of the browser tests land here
	const dir = mkdtempSync(join(tmpdir(), 'hopline-e2e-'));
	const server = await startServer(join(dir, 'e2e.sqlite'));
	const baseUrl = server.baseUrl;
	project.provide('baseUrl', baseUrl);

	return async () => {
		await server.stop();
		rmSync(dir, { recursive: true, force: true });
	};
}
