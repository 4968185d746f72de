// `npm run build`: the app and the print worker, with the bundler's notices about third-party packages left out.
import { buildApp } from './build-if-stale.js';

try {
	await buildApp();
} catch (e) {
	console.error(e.message);
	process.exit(1);
}
