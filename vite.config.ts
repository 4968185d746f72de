import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	test: {
		include: ['src/**/*.test.ts', 'tests/integration/**/*.test.ts', 'tests/cluster/**/*.test.ts'],
		environment: 'node',
		testTimeout: 60_000,
		hookTimeout: 60_000,
		pool: 'forks'
	}
});
