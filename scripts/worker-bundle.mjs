// Bundles the kinematics worker entry (src/lib/server/studies/tolerance-worker.ts) into one CommonJS text,
// which the app starts with `new Worker(code, { eval: true })`. Used by vite.config.ts (a virtual module,
// so the built app carries the text inside its server bundle) and by the bench (run under tsx).
import { build } from 'esbuild';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
export const WORKER_ENTRY = path.join(root, 'src/lib/server/studies/tolerance-worker.ts');
export const WORKER_MODULE_ID = 'virtual:lw-tolerance-worker';
// The scan processing worker (issue 17): parse, count, bounds, simplified preview.
export const SCAN_WORKER_ENTRY = path.join(root, 'src/lib/server/scans/scan-worker.ts');
export const SCAN_WORKER_MODULE_ID = 'virtual:lw-scan-worker';
const ENTRIES = { [WORKER_MODULE_ID]: WORKER_ENTRY, [SCAN_WORKER_MODULE_ID]: SCAN_WORKER_ENTRY };

/** The bundled worker code (the tolerance study's unless another entry is given) and the files it was built from. */
export async function bundleWorker(entry = WORKER_ENTRY) {
	const result = await build({
		entryPoints: [entry],
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

/** A Vite plugin serving each bundled worker's code as the default export of its virtual module. */
export function workerPlugin() {
	return {
		name: 'lw-tolerance-worker',
		resolveId(id) {
			return id in ENTRIES ? '\0' + id : null;
		},
		async load(id) {
			const entry = id.startsWith('\0') ? ENTRIES[id.slice(1)] : undefined;
			if (!entry) return null;
			const { code, inputs } = await bundleWorker(entry);
			for (const f of inputs) this.addWatchFile(f);
			return `export default ${JSON.stringify(code)};`;
		}
	};
}
