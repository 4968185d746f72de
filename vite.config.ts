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
		pool: 'forks',
		// Test files run side by side and keep every core busy: under the idle policy the print and
		// odds workers they start would wait for a free core (src/lib/threads/priority.ts).
		env: { PADDOCK_WORKER_PRIORITY: 'low' }
	}
});
