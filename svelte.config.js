import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';

/** CSP hashes of the inline scripts of src/app.html (the theme script), so they run without 'unsafe-inline'. */
const appHtml = readFileSync(new URL('./src/app.html', import.meta.url), 'utf8');
const appScriptHashes = [...appHtml.matchAll(/<script>([\s\S]*?)<\/script>/g)].map(
	(m) => `sha256-${createHash('sha256').update(m[1]).digest('base64')}`
);

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		adapter: adapter({ out: 'build' }),
		// Cross-site form posts are refused in src/lib/server/http/csrf.ts (same Origin rule as SvelteKit's, but an
		// API client with a valid bearer token and no cookie is let through), so SvelteKit's own check is off (trustedOrigins '*').
		csrf: { trustedOrigins: ['*'] },
		// Content-Security-Policy on every page (W3C CSP Level 3). Hash mode: SvelteKit hashes its inline scripts,
		// so a page's bytes are the same for every reader (the share sheet is served from a cache).
		// style 'unsafe-inline': Svelte transitions and chart layout set style attributes (SvelteKit's CSP docs).
		// The 3-D view (three.js, WebGL) needs no script or worker exceptions; blob:/data: images for the canvas
		// snapshot and chart downloads. frame-ancestors 'none': no framing (clickjacking).
		csp: {
			mode: 'hash',
			directives: {
				'default-src': ['self'],
				'script-src': ['self', ...appScriptHashes],
				'style-src': ['self', 'unsafe-inline'],
				'img-src': ['self', 'data:', 'blob:'],
				'font-src': ['self', 'data:'],
				'connect-src': ['self'],
				'worker-src': ['self', 'blob:'],
				'object-src': ['none'],
				'base-uri': ['self'],
				'form-action': ['self'],
				'frame-ancestors': ['none']
			}
		}
	}
};

export default config;
