import { createHash } from 'node:crypto';
import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/**
 * The one inline style attribute the app shows: SvelteKit's route announcer (the generated
 * .svelte-kit/generated/root.svelte). Allowed by its hash; a change in SvelteKit shows up as a
 * refusal in tests/e2e/pagesUnderCsp.test.ts.
 */
const ANNOUNCER_STYLE =
	'position: absolute; left: 0; top: 0; clip: rect(0 0 0 0); clip-path: inset(50%); overflow: hidden; white-space: nowrap; width: 1px; height: 1px';
/** @type {`sha256-${string}`} */
const announcerStyleHash = `sha256-${createHash('sha256').update(ANNOUNCER_STYLE).digest('base64')}`;

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		adapter: adapter({ out: 'build' }),
		typescript: {
			// Type-check the scripts, seed and benchmarks with the app.
			config: (tsconfig) => {
				tsconfig.include.push(
					'../seed/**/*.ts',
					'../scripts/**/*.ts',
					'../bench/**/*.ts',
					'../tailwind.config.ts'
				);
				return tsconfig;
			}
		},
		alias: {
			$migrations: 'migrations',
			$seed: 'seed'
		},
		// The origin check lives in src/lib/server/http/originCheck.ts: the same rule for pages,
		// the API's JSON error shape under /api, and no Origin needed by cookie-less scripts.
		csrf: { trustedOrigins: ['*'] },
		// Content-Security-Policy of every page, with the hash of SvelteKit's inline script rather
		// than a nonce: the same page is served to every signed-out reader from the read cache
		// (src/lib/server/http/readCache.ts), and a nonce repeated across answers is no nonce.
		// form-action is added per request in securityHeaders.ts, because the OpenID Connect
		// issuer is known only at run time. See DEVELOPERS.md, "HTTP hardening".
		csp: {
			mode: 'hash',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				'style-src': ['self'],
				'style-src-attr': ['unsafe-hashes', announcerStyleHash],
				'img-src': ['self'],
				'font-src': ['self'],
				'connect-src': ['self'],
				'worker-src': ['self'],
				'object-src': ['none'],
				'base-uri': ['none'],
				'frame-ancestors': ['none']
			}
		}
	}
};

export default config;
