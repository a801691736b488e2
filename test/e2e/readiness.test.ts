import { describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { openPage, screenshot, signInAs, useBrowser, VIEWPORTS, type ViewportName } from '../support/browser';

const baseUrl = inject('baseUrl');
const getBrowser = useBrowser();

// PID $01 bytes hand-worked from the SAE J1979 layout (from memory): D=0x25 catalyst, EVAP, O2 sensor incomplete.
const BEFORE = '41 01 00 07 65 25';
// An invented printed table: only EVAP still incomplete after the drive.
const AFTER = 'MIL: off\nMisfire: complete\nCatalyst: complete\nEVAP: incomplete\nO2 sensor: complete\nO2 sensor heater: complete';

/** A demo vehicle with a visit: the phone run and the wide run each take their own, so their snapshots do not mix. */
async function vehicleWithCase(page: Page, index: number) {
  return page.evaluate(async (i) => {
    const list = (await (await fetch('/api/vehicles')).json()) as { vehicles: { id: number; visits: number }[] };
    const vehicle = list.vehicles.filter((v) => v.visits > 0)[i]!;
    const detail = (await (await fetch(`/api/vehicles/${vehicle.id}`)).json()) as { visits: { caseId: number }[] };
    return { vehicleId: vehicle.id, caseId: detail.visits[0]!.caseId };
  }, index);
}

async function noHorizontalScroll(page: Page) {
  const { scroll, width } = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, width: window.innerWidth }));
  expect(scroll).toBeLessThanOrEqual(width);
}

describe.each(Object.keys(VIEWPORTS) as ViewportName[])('readiness panels at %s size', (viewport) => {
  it('saves a before and an after snapshot on a case and shows them on the vehicle', async () => {
    const { page, problems, context } = await openPage(getBrowser(), viewport, baseUrl);
    await signInAs(page, 'technician');
    const { vehicleId, caseId } = await vehicleWithCase(page, viewport === 'phone' ? 0 : 1);

    await page.goto(`/cases/${caseId}`);
    const panel = page.getByLabel('Emissions readiness');
    await panel.getByText('No monitor status saved').waitFor();
    await panel.getByLabel('Monitor status from the scan tool').fill(BEFORE);
    await panel.getByRole('button', { name: 'Save snapshot' }).click();
    await panel.getByText(/^Not ready: 3 incomplete/).waitFor();
    await panel.getByText('To finish the incomplete monitors').waitFor();
    await panel.getByText(/Rule: Common US practice/).waitFor();
    await panel.getByText(/local inspection rules decide/).waitFor();
    await expect(panel.getByText('Caution:', { exact: true }).count()).resolves.toBeGreaterThan(0);

    await panel.getByLabel('Snapshot label').fill('After drive cycle');
    await panel.getByLabel('Monitor status from the scan tool').fill(AFTER);
    await panel.getByRole('button', { name: 'Save snapshot' }).click();
    await panel.getByText(/Since the one before: finished: Catalyst, Oxygen sensor; still incomplete: Evaporative system/).waitFor();
    await panel.getByText(/^Ready under the shop rule, 1 incomplete/).waitFor();
    await panel.getByRole('heading', { name: 'Emissions readiness' }).scrollIntoViewIfNeeded();
    await screenshot(page, `readiness-case-${viewport}`);
    await panel.getByText('To finish the incomplete monitors').scrollIntoViewIfNeeded();
    await screenshot(page, `readiness-case-steps-${viewport}`);
    await noHorizontalScroll(page);

    await page.goto(`/vehicles/${vehicleId}`);
    const onVehicle = page.getByLabel('Emissions readiness');
    await onVehicle.getByText(/^Latest: After drive cycle/).waitFor();
    await onVehicle.getByText('All snapshots, newest first').waitFor();
    await onVehicle.getByText(/^Before drive cycle · not ready \(3 incomplete\)/).waitFor();
    await screenshot(page, `readiness-vehicle-${viewport}`);
    await noHorizontalScroll(page);
    expect(problems).toEqual([]);
    await context.close();
  });

  it('says why pasted text is not monitor status', async () => {
    const { page, problems, context } = await openPage(getBrowser(), viewport, baseUrl);
    await signInAs(page, 'technician');
    const { caseId } = await vehicleWithCase(page, 2);
    await page.goto(`/cases/${caseId}`);
    const panel = page.getByLabel('Emissions readiness');
    await panel.getByLabel('Monitor status from the scan tool').fill('41 01 00 07 65');
    await panel.getByRole('button', { name: 'Save snapshot' }).click();
    await panel.getByText(/expected 4 bytes/).waitFor();
    expect(problems.filter((p) => !(p.includes('status of 400') && p.includes('/readiness')))).toEqual([]);
    await context.close();
  });

  it('judges the monitor table in a pasted scan report', async () => {
    const { page, problems, context } = await openPage(getBrowser(), viewport, baseUrl);
    await signInAs(page, 'technician');
    await page.goto('/scan');
    // VIN: published 49 CFR 565 check-digit example, position 10 '5' = 2005
    await page.getByLabel('Scan tool printout').fill(`VIN: 1G4AH59H45G118341\nStored: P0455\nMIL status: ON\n${AFTER.split('\n').slice(1).join('\n')}`);
    await page.getByRole('button', { name: 'Read report' }).click();
    const card = page.getByLabel('Emissions readiness');
    await card.getByText('Not ready: MIL on').waitFor();
    await card.getByText(/model year 2005/).waitFor();
    await card.getByText('Evaporative system', { exact: true }).first().waitFor();
    await card.scrollIntoViewIfNeeded();
    await screenshot(page, `readiness-scan-${viewport}`);
    await noHorizontalScroll(page);
    expect(problems).toEqual([]);
    await context.close();
  });
});
