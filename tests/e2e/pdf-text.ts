// Text of a PDF (as Chromium prints it), read with Mozilla's PDF.js, page by page.
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';

/** The text of each page of a PDF, items joined by spaces; and the page size in PostScript points. */
export async function pdfPages(bytes: Buffer) {
	const doc = await getDocument({ data: new Uint8Array(bytes), useSystemFonts: false, isEvalSupported: false }).promise;
	const pages: { text: string; width: number; height: number }[] = [];
	for (let i = 1; i <= doc.numPages; i++) {
		const page = await doc.getPage(i);
		const content = await page.getTextContent();
		const [, , width, height] = page.view;
		pages.push({ text: content.items.map((item) => ('str' in item ? item.str : '')).join(' '), width, height });
	}
	await doc.destroy();
	return pages;
}
