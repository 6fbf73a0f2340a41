// The workspace's live preview over the network (client-safe, no Svelte): the edited corner solved through
// POST /api/v1/solve as the engineer types, and saved revisions overlaid through GET /api/v1/revisions/{id}/solve.
// Units as in shared/geometry-format.md (mm, degrees).

type Point = [number, number, number];

/** One sample of a solve answer (`corner-solve/1`), as far as the workspace reads it. */
export interface SolveSample {
	travel?: number;
	roll?: number;
	rack?: number;
	[key: string]: unknown;
	points?: Record<string, Point>;
	wheel_centre: Point;
	contact_patch: Point;
	fvic: [number, number] | null;
	rc_height: number | null;
}

/** A solve answer: the samples, and where the corner could not be assembled. */
export interface SolveResult {
	samples: SolveSample[];
	error: { link: string; position: number; message: string } | null;
}

/** What the 3-D view draws besides the solved points (to 0.0001 mm: under half the full answer's bytes). */
export const SCENE_FIELDS = ['wheel_centre', 'contact_patch', 'fvic', 'rc_height'];

/** POSTs a corner file to the solver; the parsed answer, or an error message. */
export async function postSolve(body: Record<string, unknown>, signal: AbortSignal): Promise<SolveResult | string> {
	const res = await fetch('/api/v1/solve', {
		method: 'POST',
		headers: { 'content-type': 'application/json' },
		body: JSON.stringify(body),
		signal
	});
	const json = await res.json();
	return res.ok ? json : (json.error?.message ?? `The solve failed (${res.status})`);
}

/** What a live solve reports to its owner. */
export interface LiveSolveEvents {
	/** the charts' answer (only the charted quantities) */
	charts(result: SolveResult): void;
	/** the 3-D view's answer (with point positions), one painted frame after the charts' */
	scene(result: SolveResult): void;
	/** an error message to show, or null when a solve succeeded */
	failure(message: string | null): void;
	/** true once a solve has been on its way for more than `slowMs`, false when it is over */
	slow(on: boolean): void;
}

/**
 * Solves the edited corner as it changes. An edit is sent at once, in the keystroke's own task, when no solve is on
 * its way, else after `debounceMs` (typing fires several); a newer request aborts the older either way. The charts'
 * solve comes first (only `fields`, to 6 decimals); once their frame is painted a second request with the point
 * positions feeds the 3-D view, so the charts never wait for it (software WebGL takes tens of ms a frame).
 */
export class LiveSolver {
	private controller: AbortController | null = null;
	private inFlight = false;
	private timer: ReturnType<typeof setTimeout> | undefined;
	private slowTimer: ReturnType<typeof setTimeout> | undefined;

	constructor(
		private readonly on: LiveSolveEvents,
		private readonly debounceMs = 25,
		private readonly slowMs = 150
	) {}

	/** Asks for a solve of `body` (geometry and sweep options), charting `fields`. */
	solve(body: Record<string, unknown>, fields: string[]): void {
		clearTimeout(this.timer);
		if (this.inFlight) this.timer = setTimeout(() => void this.run(body, fields), this.debounceMs);
		else void this.run(body, fields);
	}

	/** Cancels what is on its way (the component is going). */
	dispose(): void {
		clearTimeout(this.timer);
		clearTimeout(this.slowTimer);
		this.controller?.abort();
	}

	/** One live solve: the charts' figures, then the 3-D view's points. */
	private async run(body: Record<string, unknown>, fields: string[]): Promise<void> {
		this.controller?.abort();
		const mine = (this.controller = new AbortController());
		this.inFlight = true;
		clearTimeout(this.slowTimer);
		this.slowTimer = setTimeout(() => this.on.slow(true), this.slowMs);
		try {
			const charts = await postSolve({ ...body, fields, decimals: 6 }, mine.signal);
			if (typeof charts === 'string') return this.on.failure(charts);
			this.on.failure(null);
			this.on.charts(charts);
			this.settle();
			// after the charts' frame has been painted, so neither the request nor the 3-D draw holds it back
			await new Promise((resolve) => requestAnimationFrame(() => setTimeout(resolve)));
			const scene = await postSolve({ ...body, points: true, fields: SCENE_FIELDS, decimals: 4 }, mine.signal);
			if (typeof scene !== 'string' && !mine.signal.aborted) this.on.scene(scene);
		} catch (e) {
			if ((e as Error).name !== 'AbortError') this.on.failure('Could not reach the server to solve.');
		} finally {
			if (this.controller === mine) this.settle();
		}
	}

	/** No solve on its way any more: the slow note goes, the next edit is sent at once. */
	private settle(): void {
		clearTimeout(this.slowTimer);
		this.on.slow(false);
		this.inFlight = false;
	}
}

/**
 * Solves each overlaid saved revision with the sweep `options` (the first with point positions: it is the 3-D
 * view's ghost) and hands the answers that came back, by revision id, to `done`. Returns the cancel.
 */
export function solveOverlays(ids: readonly string[], options: Record<string, unknown>, done: (byId: Record<string, SolveResult>) => void): () => void {
	const q = new URLSearchParams(Object.entries(options).map(([k, v]) => [k, String(v)]));
	const ctrl = new AbortController();
	Promise.all(
		ids.map(async (id, i) => {
			const res = await fetch(`/api/v1/revisions/${id}/solve?${q}${i === 0 ? '&points=true' : ''}`, { signal: ctrl.signal });
			return [id, res.ok ? ((await res.json()) as SolveResult) : null] as const;
		})
	)
		.then((pairs) => done(Object.fromEntries(pairs.filter((p): p is readonly [string, SolveResult] => p[1] !== null))))
		.catch(() => {});
	return () => ctrl.abort();
}
