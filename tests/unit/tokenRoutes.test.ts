import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { scopeNeeded, TOKEN_WRITE_ROUTES } from '$lib/server/auth/tokenRoutes';
import { bearerToken } from '$lib/server/http/bearer';

function files(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const path = join(dir, name);
		return statSync(path).isDirectory() ? files(path) : [path];
	});
}

/** `METHOD routeId` of every non-read handler under src/routes/api, read from the files. */
function apiWriteHandlers(): string[] {
	const found: string[] = [];
	for (const path of files('src/routes/api')) {
		if (!path.endsWith('+server.ts')) continue;
		const routeId = '/' + relative('src/routes', path).replace(/\/?\+server\.ts$/, '');
		const text = readFileSync(path, 'utf8');
		for (const m of text.matchAll(/export const (POST|PUT|PATCH|DELETE|fallback)\b/g))
			found.push(`${m[1]} ${routeId}`);
	}
	return found.sort();
}

describe('what API tokens may call', () => {
	it('lists every non-read API handler, so a new one is closed to tokens until it is listed', () => {
		expect(Object.keys(TOKEN_WRITE_ROUTES).sort()).toEqual(apiWriteHandlers());
	});

	it('needs read for reads anywhere, the listed scope for writes, nothing elsewhere', () => {
		for (const method of ['GET', 'HEAD', 'OPTIONS'])
			expect(scopeNeeded(method, '/api/v1/potentials')).toBe('read');
		expect(scopeNeeded('POST', '/api/v1/submissions')).toBe('read+submit');
		expect(scopeNeeded('POST', '/api/v1/uploads/check')).toBe('read+submit');
		expect(scopeNeeded('POST', '/api/v1/calc/titration')).toBe('read');
		// A method the route does not have, an unknown path, no route: the token gives nothing.
		expect(scopeNeeded('DELETE', '/api/v1/submissions')).toBeNull();
		expect(scopeNeeded('POST', '/api/v1/[...rest]')).toBeNull();
		expect(scopeNeeded('POST', null)).toBeNull();
	});
});

describe('reading the Authorization header', () => {
	it('takes the token of the Bearer scheme (any case, RFC 6750) and nothing else', () => {
		expect(bearerToken('Bearer hlpat_abc')).toBe('hlpat_abc');
		expect(bearerToken('bearer  hlpat_abc ')).toBe('hlpat_abc');
		expect(bearerToken('Basic dXNlcjpwYXNz')).toBeNull();
		expect(bearerToken('Bearer')).toBeNull();
		expect(bearerToken('Bearer a b')).toBeNull();
	});
});
