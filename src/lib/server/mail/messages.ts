// The mails Linkwright sends, each as a subject, a plain-text part and an HTML part.
export interface MailContent {
	subject: string;
	text: string;
	html: string;
}

/** Text made safe for HTML. */
export function escapeHtml(value: string) {
	return value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

const DAY = new Intl.DateTimeFormat('en-GB', { dateStyle: 'long', timeZone: 'UTC' });

/** Wraps paragraphs and one button link in a plain, inline-styled HTML mail. */
function htmlMail(title: string, paragraphs: string[], link: { url: string; label: string }, footer: string) {
	const p = paragraphs.map((t) => `<p style="margin:0 0 12px">${escapeHtml(t).replace(/\n/g, '<br>')}</p>`).join('');
	return `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#1c2430;line-height:1.5;max-width:36rem">
<h1 style="font-size:18px">${escapeHtml(title)}</h1>${p}
<p style="margin:20px 0"><a href="${escapeHtml(link.url)}" style="background:#0f6e78;color:#fff;padding:8px 14px;border-radius:6px;text-decoration:none">${escapeHtml(link.label)}</a></p>
<p style="font-size:13px;color:#5b6675">Or open this address: <a href="${escapeHtml(link.url)}">${escapeHtml(link.url)}</a></p>
<p style="font-size:12px;color:#5b6675">${escapeHtml(footer)}</p></body></html>`;
}

const CAUTION =
	"Kinematic estimates: check them on the car. Structural and welded changes are for qualified fabricators working to the series' rules and local codes.";

export interface ShareMailInput {
	url: string;
	senderName: string;
	carName: string;
	cornerLabel: string;
	revisionNumber: number;
	revisionLabel: string;
	note: string;
	expiresAt: Date;
}

/** The shop link sent to the fabricator. */
export function shareLinkMail(m: ShareMailInput): MailContent {
	const what = `${m.carName}, ${m.cornerLabel.toLowerCase()}, revision ${m.revisionNumber}${m.revisionLabel ? ` (${m.revisionLabel})` : ''}`;
	const intro = `${m.senderName} shared the pickup-point coordinates of ${what} with you. The link is read only, needs no account and works until ${DAY.format(m.expiresAt)}.`;
	const lines = [intro, ...(m.note ? [`Note: ${m.note}`] : []), CAUTION];
	return {
		subject: `Coordinates: ${what}`,
		text: `${lines.join('\n\n')}\n\nOpen the sheet: ${m.url}\n`,
		html: htmlMail(`Coordinates for ${what}`, lines, { url: m.url, label: 'Open the coordinate sheet' }, 'Sent from Linkwright.')
	};
}

export interface InvitationMailInput {
	url: string;
	teamName: string;
	role: string;
	inviterName: string;
	expiresAt: Date;
}

/** An invitation to join a team with a role. */
export function invitationMail(m: InvitationMailInput): MailContent {
	const intro = `${m.inviterName} invited you to join the team “${m.teamName}” on Linkwright as ${m.role === 'engineer' ? 'an' : 'a'} ${m.role}.`;
	const how = `Accept by ${DAY.format(m.expiresAt)}: you can create an account, or sign in if you already have one.`;
	return {
		subject: `Join ${m.teamName} on Linkwright`,
		text: `${intro}\n\n${how}\n\nAccept the invitation: ${m.url}\n\nIf you did not expect this, ignore this mail.\n`,
		html: htmlMail(`Join ${m.teamName}`, [intro, how], { url: m.url, label: 'Accept the invitation' }, 'If you did not expect this, ignore this mail.')
	};
}

/** A one-time link to set a new password. */
export function passwordResetMail(m: { url: string; validMinutes: number }): MailContent {
	const intro = `Someone asked to reset the password of your Linkwright account. The link works once, for ${m.validMinutes} minutes.`;
	const ignore = 'If it was not you, ignore this mail: your password stays as it is.';
	return {
		subject: 'Reset your Linkwright password',
		text: `${intro}\n\nSet a new password: ${m.url}\n\n${ignore}\n`,
		html: htmlMail('Reset your password', [intro], { url: m.url, label: 'Set a new password' }, ignore)
	};
}
