// The mails' two parts and the sheet's CSV, as pure functions.
import { describe, expect, test } from 'vitest';
import { escapeHtml, invitationMail, passwordResetMail, shareLinkMail } from '../../../src/lib/server/mail/messages';
import { sheetCsv, type SheetRow } from '../../../src/lib/server/sharing/sheet-csv';

describe('mails', () => {
	const url = 'http://127.0.0.1:3000/s/abc?x=1&y=2';

	test('each has a plain-text and an HTML part holding the link, with HTML escaped', () => {
		const share = shareLinkMail({
			url,
			senderName: 'Ada <script>',
			carName: 'Test car',
			cornerLabel: 'Front left',
			revisionNumber: 4,
			revisionLabel: 'rack moved',
			note: 'Use the "new" brackets & spacers',
			expiresAt: new Date('2026-06-30T12:00:00Z')
		});
		expect(share.subject).toBe('Coordinates: Test car, front left, revision 4 (rack moved)');
		expect(share.text).toContain(url);
		expect(share.text).toContain('30 June 2026');
		expect(share.html).toContain('href="http://127.0.0.1:3000/s/abc?x=1&amp;y=2"');
		expect(share.html).toContain('Ada &lt;script&gt;');
		expect(share.html).not.toContain('<script>');
		expect(share.html).toContain('&quot;new&quot; brackets &amp; spacers');
		for (const mail of [invitationMail({ url, teamName: 'Crew', role: 'engineer', inviterName: 'Bo', expiresAt: new Date() }), passwordResetMail({ url, validMinutes: 60 })]) {
			expect(mail.text).toContain(url);
			expect(mail.html).toContain(escapeHtml(url));
		}
	});
});

describe('sheet CSV', () => {
	const rows: SheetRow[] = [
		{ name: 'steer.inner', label: 'Tie rod, inner joint', xyz: [-145.04, 358, 196.06], delta: { dx: -15, dy: 0, dz: 20, d: 25 }, tolerance: { mm: 0.25, mode: 'axis' } },
		{ name: 'lower.front', label: 'Lower arm, front pivot', xyz: [180, -0.04, 127], delta: null, tolerance: null }
	];

	test('writes 0.1 mm figures without "-0.0", quotes labels with commas, leaves empty cells where nothing applies', () => {
		expect(sheetCsv(rows, true).split('\r\n')).toEqual([
			'point,description,x_mm,y_mm,z_mm,dx_mm,dy_mm,dz_mm,tolerance_mm,tolerance_mode',
			'steer.inner,"Tie rod, inner joint",-145.0,358.0,196.1,-15.0,0.0,20.0,0.25,axis',
			'lower.front,"Lower arm, front pivot",180.0,0.0,127.0,,,,,',
			''
		]);
		expect(sheetCsv(rows, false).split('\r\n')[0]).toBe('point,description,x_mm,y_mm,z_mm,dx_mm,dy_mm,dz_mm');
	});
});
