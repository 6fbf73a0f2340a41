// One crosshair for all the charts of a page (issue 19): a page (or a part of it) calls linkCharts() once, and every
// MeasureChart inside reads and moves the same sweep position, so hovering a travel in one chart shows that travel
// in all. Charts outside a linked part keep their own cursor. Client-safe, no DOM.
import { getContext, setContext } from 'svelte';

const KEY = Symbol('lw-linked-cursor');

/** The shared cursor: a sweep position in the charts' x unit, or null when the pointer is away. */
export class LinkedCursor {
	x = $state<number | null>(null);
	unit = $state<string | null>(null);

	/** Moves every linked chart's cursor to x (in `unit`), or hides them all (null). */
	set(x: number | null, unit: string) {
		this.x = x;
		this.unit = x === null ? null : unit;
	}

	/** Where a chart whose x axis is in `unit` shows the cursor: null when hidden or in another unit. */
	at(unit: string): number | null {
		return this.x !== null && this.unit === unit ? this.x : null;
	}
}

/** Links the charts of the calling component and its children; returns the shared cursor. */
export function linkCharts(): LinkedCursor {
	return setContext(KEY, new LinkedCursor());
}

/** The shared cursor of the enclosing linked part, if any. */
export function linkedCursor(): LinkedCursor | undefined {
	return getContext<LinkedCursor | undefined>(KEY);
}
