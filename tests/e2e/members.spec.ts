// An owner invites a new engineer by mail; the invitation's link creates the account, which can then edit.
// The journey signs up its own owner and team, so it depends on no other journey's data.
import { expect, test } from '@playwright/test';

test('an owner invites a new engineer; the mailed link works and the new account can create a car in the team', async ({ page, browser }) => {
	test.setTimeout(90_000);
	const stamp = Date.now();
	const ownerEmail = `owner-${stamp}@example.test`;
	const engineerEmail = `new-engineer-${stamp}@example.test`;
	const teamName = `Pit crew ${stamp}`;

	await page.goto('/signup');
	await page.getByLabel('Your name').fill('Invented Owner');
	await page.getByLabel('E-mail').fill(ownerEmail);
	await page.getByLabel('Password (at least 10 characters)').fill('a long owner secret');
	await page.getByLabel('Team name').fill(teamName);
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page.getByRole('heading', { name: 'Cars' })).toBeVisible();

	// The members page is in the account menu of the top bar.
	await page.getByRole('button', { name: 'Invented Owner' }).click();
	await page.getByRole('menuitem', { name: `Members of ${teamName}` }).click();
	await expect(page.getByRole('heading', { name: `Members of ${teamName}` })).toBeVisible();
	await page.getByLabel('E-mail').fill(engineerEmail);
	await page.getByLabel('Role', { exact: true }).selectOption('engineer');
	await page.getByRole('button', { name: 'Send invitation' }).click();
	await expect(page.getByTestId('members-notice')).toHaveText(`Invitation mailed to ${engineerEmail}.`);
	await expect(page.getByTestId('invitations-table')).toContainText(engineerEmail);
	await page.screenshot({ path: 'test-results/screens/members.png', fullPage: true });

	// The invitation mail in the fake SMTP server's mailbox.
	await page.goto(`/dev/mail?to=${encodeURIComponent(engineerEmail)}`);
	await page.getByTestId('mail-list').getByRole('link').first().click();
	await expect(page.getByTestId('mail-text')).toContainText(`join the team “${teamName}” on Linkwright as an engineer`);
	const link = await page.getByTestId('mail-text').getByRole('link').first().getAttribute('href');
	expect(link).toMatch(/\/invite\/[A-Za-z0-9_-]{43}$/);

	// The invited person, in a browser of their own, creates the account from the link.
	const invited = await browser.newContext();
	const them = await invited.newPage();
	await them.goto(link!);
	await expect(them.getByTestId('invite-role')).toHaveText('engineer');
	await them.screenshot({ path: 'test-results/screens/invitation.png', fullPage: true });
	await them.getByLabel('Your name').fill('Invented Engineer');
	await them.getByLabel('Password').fill('another long secret');
	await them.getByRole('button', { name: 'Create account and join' }).click();
	await expect(them.getByRole('heading', { name: 'Cars' })).toBeVisible();
	await expect(them.getByTestId('role-badge')).toHaveText('engineer');

	// ... and can edit: a new car in the owner's team.
	await them.getByRole('link', { name: 'New car' }).first().click();
	await expect(them.getByRole('heading', { name: `New car for ${teamName}` })).toBeVisible();
	await them.getByLabel('Name').fill('Invited engineer car');
	await them.getByRole('button', { name: 'Create car' }).click();
	await expect(them.getByRole('heading', { name: 'Invited engineer car' })).toBeVisible();
	await invited.close();

	// The owner sees the new member, no pending invitation, and both steps in the audit log.
	await page.goto('/team/members');
	await expect(page.getByTestId('members-table').locator(`tr[data-member="${engineerEmail}"]`)).toContainText('Invented Engineer');
	await expect(page.getByTestId('invitations-table')).toHaveCount(0);
	await page.goto('/team/audit');
	await expect(page.getByTestId('audit-table').locator('tr[data-action="member.invited"]')).toContainText(engineerEmail);
	await expect(page.getByTestId('audit-table').locator('tr[data-action="invitation.accepted"]')).toContainText('Invented Engineer');
	await page.screenshot({ path: 'test-results/screens/audit.png', fullPage: true });
});
