// The bundled worker entry of the tolerance study (scripts/worker-bundle.mjs through a Vite virtual module):
// the built app carries it as text in its own server bundle, so no worker file has to be found at run time.
import code from 'virtual:lw-tolerance-worker';

export const workerCode: string = code;
