// Bundles the kinematics worker entry (src/lib/server/studies/tolerance-worker.ts) into one CommonJS text,
// which the app starts with `new Worker(code, { eval: true })`. Used by vite.config.ts (a virtual module,
// so the built app carries the text inside its server bundle) and by the bench (run under tsx).
import { build } from 'esbuild';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
export const WORKER_ENTRY = path.join(root, 'src/lib/server/studies/tolerance-worker.ts');
export const WORKER_MODULE_ID = 'virtual:lw-tolerance-worker';

/** The bundled worker code and the files it was built from. */
export async function bundleWorker() {
	const result = await build({
		entryPoints: [WORKER_ENTRY],
		bundle: true,
		platform: 'node',
		format: 'cjs',
		target: 'node20',
		write: false,
		metafile: true,
		logLevel: 'silent'
	});
	return { code: result.outputFiles[0].text, inputs: Object.keys(result.metafile.inputs).map((f) => path.resolve(root, f)) };
}

/** A Vite plugin serving the bundled worker code as the default export of `virtual:lw-tolerance-worker`. */
export function workerPlugin() {
	const resolved = '\0' + WORKER_MODULE_ID;
	return {
		name: 'lw-tolerance-worker',
		resolveId(id) {
			return id === WORKER_MODULE_ID ? resolved : null;
		},
		async load(id) {
			if (id !== resolved) return null;
			const { code, inputs } = await bundleWorker();
			for (const f of inputs) this.addWatchFile(f);
			return `export default ${JSON.stringify(code)};`;
		}
	};
}
