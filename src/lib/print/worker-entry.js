// The print worker's first module (plain JavaScript, started by ./pool.ts through piscina): loads
// the worker itself, through tsx's loader when it is the TypeScript source.
import { workerData } from 'piscina';

if (workerData.tsx) {
	const api = await import(workerData.tsx);
	(api.register ?? api.default.register)();
}
const worker = await import(workerData.entry);
export default worker.default;
