// A chart's downloads: a self-contained SVG drawing, a PNG at 2× drawn from it, and the plotted values as CSV.
// Browser-only (DOM, canvas); the CSV writer is loaded on click, so the workspace's first load carries none.
import { bandColour, bandLabel, type Band, type Series } from './chart-data';

/** What an export reads of the chart as it is on screen. */
export interface ChartExport {
	/** the plot's <svg> and the chart's <figure> */
	svgEl: SVGElement;
	figureEl: HTMLElement;
	title: string;
	note?: string;
	xLabel: string;
	xUnit: string;
	yUnit: string;
	series: readonly Series[];
	/** the series' CSS colours, in order */
	colours: readonly string[];
	band: Band | null;
	/** the plot's height and padding, px */
	height: number;
	pad: { top: number; right: number; bottom: number; left: number };
	/** the file name without its extension */
	slug: string;
}

const STYLE_PROPS = [
	'fill',
	'fill-opacity',
	'stroke',
	'stroke-width',
	'stroke-opacity',
	'stroke-dasharray',
	'stroke-linecap',
	'stroke-linejoin',
	'opacity',
	'font-family',
	'font-size',
	'font-weight',
	'font-variant-numeric',
	'text-anchor',
	'dominant-baseline'
];

/** Copy the computed presentation styles of `from` and its descendants onto the clone `to`, dropping skipped nodes. */
function inlineStyles(from: Element, to: Element) {
	const css = getComputedStyle(from);
	to.setAttribute('style', STYLE_PROPS.map((p) => `${p}:${css.getPropertyValue(p)}`).join(';'));
	to.removeAttribute('class');
	const a = Array.from(from.children);
	const b = Array.from(to.children);
	for (let i = a.length - 1; i >= 0; i--) {
		if (a[i].getAttribute('data-export') === 'skip') b[i].remove();
		else inlineStyles(a[i], b[i]);
	}
}

/** A CSS colour (possibly with var()) as the browser resolves it now, inside `figureEl`. */
function resolveColour(figureEl: HTMLElement, colour: string): string {
	const probe = document.createElement('span');
	probe.style.color = colour;
	figureEl.appendChild(probe);
	const c = getComputedStyle(probe).color;
	probe.remove();
	return c;
}

/** A self-contained SVG document of the chart: title, legend and plot, colours as computed now. */
function svgDocument(c: ChartExport): { text: string; width: number; height: number } {
	const { svgEl, figureEl, pad } = c;
	const NS = 'http://www.w3.org/2000/svg';
	const css = getComputedStyle(figureEl);
	const ink = css.color;
	const font = css.fontFamily;
	const w = Math.round(svgEl.getBoundingClientRect().width + pad.left + pad.right);
	const items = [
		...c.series.map((s, i) => ({ label: s.label, colour: resolveColour(figureEl, c.colours[i]), ghost: !!s.ghost, dotted: !!s.dotted, rect: false })),
		...(c.band ? [{ label: bandLabel(c.band), colour: resolveColour(figureEl, bandColour(c.band)), ghost: false, dotted: false, rect: true }] : [])
	];
	// legend entries flow in rows like the on-screen legend (text width estimated at 6.6 px a character)
	const at: { x: number; y: number }[] = [];
	let lx = 12;
	let ly = 44;
	for (const it of items) {
		const iw = 24 + it.label.length * 6.6 + 20;
		if (lx > 12 && lx + iw > w - 12) {
			lx = 12;
			ly += 18;
		}
		at.push({ x: lx, y: ly });
		lx += iw;
	}
	const top = ly + 8;
	const h = top + c.height;
	const doc = document.createElementNS(NS, 'svg');
	doc.setAttribute('xmlns', NS);
	doc.setAttribute('width', String(w));
	doc.setAttribute('height', String(h));
	doc.setAttribute('viewBox', `0 0 ${w} ${h}`);
	const add = (tag: string, attrs: Record<string, string | number>, text?: string) => {
		const el = document.createElementNS(NS, tag);
		for (const [k, v] of Object.entries(attrs)) el.setAttribute(k, String(v));
		if (text !== undefined) el.textContent = text;
		doc.appendChild(el);
		return el;
	};
	add('rect', { width: w, height: h, fill: css.backgroundColor });
	add('text', { x: 12, y: 22, fill: ink, 'font-family': font, 'font-size': 14, 'font-weight': 600 }, c.title);
	if (c.note) add('text', { x: 12 + c.title.length * 8.4 + 10, y: 22, fill: resolveColour(figureEl, 'rgb(var(--lw-muted))'), 'font-family': font, 'font-size': 12 }, c.note);
	items.forEach((it, i) => {
		const { x, y } = at[i];
		if (it.rect) add('rect', { x, y: y - 5, width: 18, height: 10, fill: it.colour, 'fill-opacity': 0.18, stroke: it.colour, 'stroke-opacity': 0.6 });
		else add('line', { x1: x, y1: y, x2: x + 18, y2: y, stroke: it.colour, 'stroke-width': 2, 'stroke-dasharray': it.dotted ? '0.5 4' : it.ghost ? '5 4' : 'none', 'stroke-linecap': it.dotted ? 'round' : 'butt', opacity: it.ghost ? 0.7 : 1 });
		add('text', { x: x + 24, y: y + 4, fill: ink, 'font-family': font, 'font-size': 12 }, it.label);
	});
	const plot = svgEl.cloneNode(true) as SVGElement;
	inlineStyles(svgEl, plot);
	const g = document.createElementNS(NS, 'g');
	g.setAttribute('transform', `translate(${pad.left},${top + pad.top})`);
	while (plot.firstChild) g.appendChild(plot.firstChild);
	doc.appendChild(g);
	return { text: new XMLSerializer().serializeToString(doc), width: w, height: h };
}

/** Save a blob under a file name through a temporary link. */
function save(blob: Blob, name: string) {
	const url = URL.createObjectURL(blob);
	const a = document.createElement('a');
	a.href = url;
	a.download = name;
	document.body.appendChild(a);
	a.click();
	a.remove();
	setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/** Save the chart as an SVG drawing. */
export function exportSvg(c: ChartExport) {
	save(new Blob([svgDocument(c).text], { type: 'image/svg+xml' }), `${c.slug}.svg`);
}

/** Draw the SVG document into a canvas at 2× and save it as PNG. */
export async function exportPng(c: ChartExport) {
	const d = svgDocument(c);
	const url = URL.createObjectURL(new Blob([d.text], { type: 'image/svg+xml' }));
	try {
		const img = new Image();
		img.src = url;
		await img.decode();
		const canvas = document.createElement('canvas');
		canvas.width = d.width * 2;
		canvas.height = d.height * 2;
		const ctx = canvas.getContext('2d');
		if (!ctx) return;
		ctx.scale(2, 2);
		ctx.drawImage(img, 0, 0, d.width, d.height);
		const png = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, 'image/png'));
		if (png) save(png, `${c.slug}.png`);
	} finally {
		URL.revokeObjectURL(url);
	}
}

/** Save the plotted values as CSV (one row per sweep position, one column per series). */
export async function exportCsv(c: ChartExport) {
	const { buildCsv } = await import('./chart-csv');
	const text = buildCsv({ xLabel: c.xLabel, xUnit: c.xUnit, yLabel: c.title, yUnit: c.yUnit, series: c.series });
	save(new Blob([text], { type: 'text/csv;charset=utf-8' }), `${c.slug}.csv`);
}
