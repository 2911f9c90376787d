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
		}
	}
};

export default config;
