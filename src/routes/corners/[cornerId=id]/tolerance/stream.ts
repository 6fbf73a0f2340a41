// Reads the tolerance study's NDJSON stream: progress lines, then the result (client-safe).
import type { FitMeasureKey } from '$lib/schemas/analysis';

export interface StudyBands {
	key: FitMeasureKey;
	nominal: number[];
	min: number[];
	max: number[];
	p5: number[];
	p95: number[];
	sd: number[];
	sdFirstOrder: number[];
}

export interface StudyResult {
	positions: number[];
	samples: number;
	failed: number;
	seed: number;
	distribution: 'normal' | 'uniform';
	tolerances: { point: string; mm: number; mode: 'axis' | 'sphere' }[];
	threads: number;
	fallback: string | null;
	/** chunks solved by the job queue's workers (a study of 20,000 samples or more); 0 or absent: in the request */
	queuedChunks?: number;
	ms: number;
	bands: StudyBands[];
	shares: Record<string, { point: string; share: number }[]>;
	suggestion: { measure: FitMeasureKey; band: [number, number]; range: [number, number]; points: { point: string; mm: number; mode: 'axis' | 'sphere' }[] | null; reason: string };
}

export interface Ranking {
	key: string;
	label: string;
	unit: string;
	ranked: { point: string; axis: string; derivative: number }[];
}

/** Posts `body`, calls `progress(done)` per progress line, and resolves with the result or an error message. */
export async function readStudy(url: string, body: unknown, signal: AbortSignal, progress: (done: number) => void): Promise<{ result: StudyResult; studyId: string | null } | { error: string }> {
	const res = await fetch(url, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body), signal });
	if (!res.ok || !res.body) return { error: (await res.json().catch(() => null))?.error?.message ?? `The study failed (${res.status})` };
	const reader = res.body.pipeThrough(new TextDecoderStream()).getReader();
	let buffered = '';
	for (;;) {
		const { value, done } = await reader.read();
		if (done) break;
		buffered += value;
		let nl: number;
		while ((nl = buffered.indexOf('\n')) >= 0) {
			const line = buffered.slice(0, nl);
			buffered = buffered.slice(nl + 1);
			if (!line.trim()) continue;
			const msg = JSON.parse(line);
			if (msg.type === 'progress') progress(msg.done);
			else if (msg.type === 'result') return { result: msg.result, studyId: msg.studyId };
			else if (msg.type === 'error') return { error: msg.error.message };
		}
	}
	return { error: 'The study ended without a result' };
}
