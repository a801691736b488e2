import { describe, expect, inject, it } from 'vitest';
import { demoPerson as person, openPage, screenshot, signInAs, signInThroughUi, useBrowser, VIEWPORTS, type ViewportName } from '../support/browser';

const baseUrl = inject('baseUrl');
const getBrowser = useBrowser();

describe.each(Object.keys(VIEWPORTS) as ViewportName[])('signed-in shell at %s size', (viewport) => {
  it('shows the sign-in page with no console errors or CSP violations', async () => {
    const { page, problems, context } = await openPage(getBrowser(), viewport, baseUrl);
    await page.goto('/');
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    expect(page.url()).toMatch(/\/sign-in$/);
    await screenshot(page, `sign-in-${viewport}`);
    expect(problems).toEqual([]);
    await context.close();
  });

  it('refuses a wrong password with the generic message', async () => {
    const { page, context } = await openPage(getBrowser(), viewport, baseUrl);
    await signInThroughUi(page, person('technician').email, 'not the right one');
    await page.getByText('That e-mail and password do not match an active account.').waitFor();
    expect(page.url()).toMatch(/\/sign-in$/);
    await context.close();
  });

  for (const role of ['apprentice', 'technician', 'senior', 'manager'] as const) {
    it(`signs in as ${role} and shows the shell for that role`, async () => {
      const { page, problems, context } = await openPage(getBrowser(), viewport, baseUrl);
      await signInAs(page, role);
      const nav = page.getByRole('navigation', { name: 'Main' });
      await nav.getByText('Search').waitFor();
      if (viewport === 'wide') {
        // managers see the team and outbox in the side navigation; nobody else does
        expect(await nav.getByText('Team').count()).toBe(role === 'manager' ? 1 : 0);
        expect(await nav.getByText('Outbox').count()).toBe(role === 'manager' ? 1 : 0);
        await nav.getByText(person(role).name).waitFor();
      }
      // the home starts the day: every role sees its own lists, seniors and managers the review queue, managers comebacks and the digest
      await page.getByRole('heading', { name: 'My open walks' }).waitFor();
      await page.getByRole('heading', { name: 'Sent back to you' }).waitFor();
      expect(await page.getByRole('heading', { name: 'Waiting for your review' }).count()).toBe(role === 'senior' || role === 'manager' ? 1 : 0);
      expect(await page.getByRole('heading', { name: 'Comebacks this week' }).count()).toBe(role === 'manager' ? 1 : 0);
      expect(await page.getByRole('heading', { name: 'Weekly digest' }).count()).toBe(role === 'manager' ? 1 : 0);
      await screenshot(page, `home-${role}-${viewport}`, { fullPage: viewport === 'phone' });
      if (role === 'manager') {
        await page.goto('/team');
        await page.getByText('Invite someone').waitFor();
        await page.getByText(person('apprentice').email).waitFor();
        await screenshot(page, `team-${viewport}`);
        await page.goto('/settings');
        await page.getByRole('heading', { name: 'Shop settings' }).waitFor();
        await page.getByText(/Today in the shop: .*Europe\/London.*United Kingdom/).waitFor();
        await screenshot(page, `settings-${viewport}`);
        await page.goto('/outbox');
        await page.getByRole('heading', { name: 'Outbox' }).waitFor();
        await screenshot(page, `outbox-${viewport}`);
      }
      await page.goto('/account');
      await page.getByRole('button', { name: 'Sign out' }).click();
      await page.getByRole('button', { name: 'Sign in' }).waitFor();
      expect(problems).toEqual([]);
      await context.close();
    });
  }

  it('shows the not-found page for an unknown path', async () => {
    const { page, context } = await openPage(getBrowser(), viewport, baseUrl);
    await page.goto('/no/such/page');
    await page.getByText('No page here').waitFor();
    await context.close();
  });
});

