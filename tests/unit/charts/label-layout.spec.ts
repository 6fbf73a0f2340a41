// The 3-D view's screen-space label de-overlap (src/lib/components/linkage/labels.ts, spreadLabels).
// Boxes are axis-aligned rectangles in CSS pixels; two overlap exactly when their x and y intervals both
// intersect (the separating axis theorem for axis-aligned boxes: Ericson, Real-Time Collision Detection, 4.2).
import { describe, expect, it } from 'vitest';
import { overlaps, spreadLabels, type LabelBox } from '../../../src/lib/components/linkage/labels';

/** The boxes moved by the offsets. */
const placed = (boxes: LabelBox[], gap = 2) => spreadLabels(boxes, gap).map((o, i) => ({ ...boxes[i], x: boxes[i].x + o.dx, y: boxes[i].y + o.dy }));
/** Every pair apart, written out here (not through the module's overlaps). */
function allApart(boxes: LabelBox[]) {
	for (let i = 0; i < boxes.length; i++)
		for (let j = i + 1; j < boxes.length; j++) {
			const [a, b] = [boxes[i], boxes[j]];
			const apart = a.x + a.w <= b.x || b.x + b.w <= a.x || a.y + a.h <= b.y || b.y + b.h <= a.y;
			if (!apart) return false;
		}
	return true;
}

describe('spreadLabels', () => {
	it('leaves labels that do not overlap where they are', () => {
		const boxes = [
			{ x: 10, y: 10, w: 40, h: 18 },
			{ x: 100, y: 10, w: 40, h: 18 },
			{ x: 10, y: 60, w: 40, h: 18 }
		];
		expect(spreadLabels(boxes)).toEqual([{ dx: 0, dy: 0 }, { dx: 0, dy: 0 }, { dx: 0, dy: 0 }]);
	});

	it('moves the second of two labels on the same spot clear of the first, which stays', () => {
		// the front view: roll centre and instant centre labels anchored 4 px apart
		const boxes = [
			{ x: 200, y: 150, w: 24, h: 18 },
			{ x: 202, y: 154, w: 38, h: 18 }
		];
		const out = spreadLabels(boxes);
		expect(out[0]).toEqual({ dx: 0, dy: 0 });
		expect(allApart(placed(boxes))).toBe(true);
		// a small nudge: no farther than two label heights
		expect(Math.hypot(out[1].dx, out[1].dy)).toBeLessThanOrEqual(2 * 18);
	});

	it('separates three labels piled on one point', () => {
		const boxes = [
			{ x: 300, y: 200, w: 24, h: 18 },
			{ x: 300, y: 200, w: 38, h: 18 },
			{ x: 290, y: 205, w: 70, h: 18 }
		];
		expect(allApart(boxes)).toBe(false);
		expect(allApart(placed(boxes))).toBe(true);
	});

	it('keeps the gap asked for', () => {
		const boxes = [
			{ x: 0, y: 0, w: 30, h: 18 },
			{ x: 0, y: 19, w: 30, h: 18 } // 1 px apart: closer than a 4 px gap
		];
		const [, b] = placed(boxes, 4);
		expect(b.y - 18 >= 4 || 0 - (b.y + 18) >= 4 || b.x - 30 >= 4 || 0 - (b.x + b.w) >= 4).toBe(true);
	});

	it('overlaps counts touching boxes apart only without a gap', () => {
		const a = { x: 0, y: 0, w: 10, h: 10 };
		const b = { x: 10, y: 0, w: 10, h: 10 };
		expect(overlaps(a, b)).toBe(false);
		expect(overlaps(a, b, 1)).toBe(true);
	});
});

describe('spreadLabels with a fixed box', () => {
	it('moves a label off the axes triad, which stays where it is', () => {
		const triad = { x: 24, y: 200, w: 130, h: 124 };
		const rc = { x: 80, y: 260, w: 30, h: 18 }; // anchored inside the triad's corner
		const [o] = spreadLabels([rc], 2, [triad]);
		expect(allApart([triad, { ...rc, x: rc.x + o.dx, y: rc.y + o.dy }])).toBe(true);
	});
});

describe('spreadLabels within the view', () => {
	it('does not push a label out of the view to clear another', () => {
		const view = { w: 390, h: 366 };
		const triad = { x: 24, y: 200, w: 130, h: 124 };
		const centreline = { x: 4, y: 270, w: 62, h: 18 }; // ends at the line near the left edge, over the triad
		const [o] = spreadLabels([centreline], 2, [triad], view);
		const b = { ...centreline, x: centreline.x + o.dx, y: centreline.y + o.dy };
		expect(b.x).toBeGreaterThanOrEqual(0);
		expect(b.x + b.w).toBeLessThanOrEqual(view.w);
		expect(b.y).toBeGreaterThanOrEqual(0);
		expect(b.y + b.h).toBeLessThanOrEqual(view.h);
		expect(allApart([triad, b])).toBe(true);
	});
});

describe('spreadLabels leaves a clear label where it is', () => {
	it('inside the view, clear of the others (floating-point edges do not count as overlap)', () => {
		// the side view of the demo corner: the roll centre's and the instant centre's labels 40 px apart
		const boxes = [
			{ x: 194.4826535756691, y: 248.77001533162579, w: 22.135135135135133, h: 18.2 },
			{ x: 194.48265357566902, y: 209.40068717655035, w: 33.94054054054054, h: 18.2 }
		];
		expect(spreadLabels(boxes, 2, [{ x: 24, y: 215, w: 130, h: 124 }], { w: 389, h: 366 })).toEqual([{ dx: 0, dy: 0 }, { dx: 0, dy: 0 }]);
	});
});
