// The worker code that vite.config.ts's plugin (scripts/worker-bundle.mjs) serves as a module.
declare module 'virtual:lw-tolerance-worker' {
	const code: string;
	export default code;
}
declare module 'virtual:lw-scan-worker' {
	const code: string;
	export default code;
}
