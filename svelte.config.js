import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

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
		// Content-Security-Policy of every page, with a nonce for SvelteKit's inline script (a hash
		// on prerendered pages). form-action is added per request in securityHeaders.ts, because
		// the OpenID Connect issuer is known only at run time. See DEVELOPERS.md, "HTTP hardening".
		csp: {
			mode: 'auto',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				'style-src': ['self'],
				'style-src-attr': ['none'],
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
