import adapter from '@sveltejs/adapter-node';

/** @type {import('@sveltejs/kit').Config} */
export default {
	kit: {
		adapter: adapter({ out: 'build' }),
		// Form posts are checked by SvelteKit; JSON writes are checked in hooks.server.ts.
		csrf: { trustedOrigins: [] }
	}
};
