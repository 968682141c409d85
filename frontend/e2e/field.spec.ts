import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Locator, Page } from 'playwright-core';
import sharp from 'sharp';
import { addCalendarDays, calendarWeekday, todayInZone } from '@loambook/common';
import { demo, DESKTOP, PHONE, signIn, startStack, type Stack } from './support/stack';
import { apiAs, closeWindowAndTakeDeposit, makeSignedJob, type FieldJob } from './support/field';

/**
 * Issue #4's journey, on a phone: a signed job (set up through the API) is on the crew for today; the crew
 * lead opens it from Today, starts it, logs injection points with a photo, loses the signal while logging
 * one (it waits on the phone and goes when the signal is back), writes the day's hours, and completes the
 * job with a re-survey and the homeowner's signature. The manager then sees the actual margin.
 */
describe('journey: a field job from the crew lead’s phone', () => {
  let stack: Stack;
  let job: FieldJob;
  /** Signed 26 days ago with a 15 % deposit, not scheduled: its permit clock is due within the week. */
  let atRisk: FieldJob;
  /** Signed today (the homeowner may still cancel), on the pier crew next week. */
  let fresh: FieldJob;
  let branchId: string;
  let pierCrewId = '';
  let foamCrewId = '';
  let today: string;
  const homeowner = { name: 'Thessaly Marchbank', email: `thessaly.marchbank.${Date.now()}@example.com` };

  beforeAll(async () => {
    stack = await startStack('field');
    const manager = await apiAs(
      stack,
      demo('branch_manager', 'MRW').email,
      demo('branch_manager', 'MRW').password,
    );
    const seller = await apiAs(stack, demo('salesperson', 'MRW').email, demo('salesperson', 'MRW').password);
    const branches = await manager.get<{ id: string; code: string; timezone: string }[]>('/branches');
    const mrw = branches.find((b) => b.code === 'MRW')!;
    branchId = mrw.id;
    job = await makeSignedJob(stack, seller, branchId, homeowner);
    await closeWindowAndTakeDeposit(stack, job.contractId);

    atRisk = await makeSignedJob(stack, seller, branchId, {
      name: 'Ottoline Brask',
      email: `ottoline.brask.${Date.now()}@example.com`,
      street: '9 Sedgefield Row',
    });
    await closeWindowAndTakeDeposit(stack, atRisk.contractId, 26);
    fresh = await makeSignedJob(stack, seller, branchId, {
      name: 'Ferris Quennell',
      email: `ferris.quennell.${Date.now()}@example.com`,
      street: '150 Lantern Hill Road',
    });

    // The manager files the 811 ticket (a week ago: past its earliest dig date) and puts the job on the
    // foam crew for today and tomorrow; the fresh job goes on the pier crew next Monday.
    today = todayInZone(mrw.timezone);
    await manager.send('PUT', `/jobs/${job.jobId}/locate`, {
      ticketNumber: 'MRW-811-4471',
      filedOn: addCalendarDays(today, -7),
    });
    const crews = await manager.get<{ id: string; name: string }[]>(`/crews?branchId=${branchId}`);
    foamCrewId = crews.find((c) => c.name === 'Marrowfield foam crew')!.id;
    pierCrewId = crews.find((c) => c.name === 'Marrowfield pier crew')!.id;
    await manager.send('PUT', `/jobs/${job.jobId}/schedule`, {
      crewId: foamCrewId,
      startOn: today,
      durationDays: 2,
    });
    await manager.send('PUT', `/jobs/${fresh.jobId}/schedule`, {
      crewId: pierCrewId,
      startOn: nextMonday(today),
      durationDays: 2,
    });
  });
  afterAll(() => stack?.close());

  const nextMonday = (day: string) => {
    let d = addCalendarDays(day, 1);
    while (calendarWeekday(d) !== 1) d = addCalendarDays(d, 1);
    return d;
  };

  /** HTML5 drag and drop with the mouse: the target may lie under another job's block (the row takes it). */
  async function drag(page: Page, source: Locator, target: Locator) {
    await source.scrollIntoViewIfNeeded();
    const from = (await source.boundingBox())!;
    await page.mouse.move(from.x + Math.min(20, from.width / 2), from.y + Math.min(20, from.height / 2));
    await page.mouse.down();
    const to = (await target.boundingBox())!;
    await page.mouse.move(to.x + to.width / 2, to.y + 12, { steps: 8 });
    await page.mouse.up();
  }

  async function logPoint(page: Page, n: number, pounds: string, reason: RegExp, photo?: Buffer) {
    const form = page.getByRole('form', { name: /Log injection point/ });
    await expect.poll(() => form.getByRole('button', { name: `Save point ${n}` }).isVisible()).toBe(true);
    await form.getByLabel('Wall or side').fill('South wall');
    await form.getByLabel('Along the wall').fill(String(n * 4));
    await form.getByLabel('Depth reached').fill('3.5');
    await form.getByLabel('Pounds pumped').fill(pounds);
    await form.getByText(reason).click();
    if (photo) {
      await page
        .locator('#entry-photo')
        .setInputFiles({ name: `point-${n}.jpg`, mimeType: 'image/jpeg', buffer: photo });
    }
    await form.getByRole('button', { name: `Save point ${n}` }).click();
  }

  it('runs from Today to the homeowner’s signature, and the manager sees the margin', async () => {
    // ---- The crew lead, on a phone.
    const lead = demo('crew_lead', 'MRW');
    const ctx = await stack.browser.newContext({
      viewport: PHONE,
      isMobile: true,
      hasTouch: true,
      baseURL: stack.baseUrl,
    });
    const page = await ctx.newPage();
    await signIn(page, lead.email, lead.password);
    await page.getByRole('button', { name: 'Menu', exact: true }).click();
    await page.getByRole('link', { name: 'Today' }).click();
    await page.waitForURL(/\/today$/);
    await expect.poll(() => page.getByText(homeowner.name).isVisible()).toBe(true);
    await stack.shot(page, 'crew-today');

    await page.getByRole('link', { name: new RegExp(homeowner.name) }).click();
    await page.waitForURL(/\/jobs\/[0-9a-f-]{36}\/field$/);
    await expect.poll(() => page.getByText('Safety on this job').isVisible()).toBe(true);
    await stack.shot(page, 'crew-job-ready');
    await expect.poll(() => page.getByRole('button', { name: 'Start job' }).isVisible()).toBe(true);

    // Start: the crew lead confirms the locate marks and the PPE.
    await page.getByRole('button', { name: 'Start job' }).click();
    await page.getByText(/The utilities’ marks are on the ground/).click();
    await stack.shot(page, 'crew-start-confirm');
    await page.getByRole('button', { name: 'Yes, start the job' }).click();
    await expect.poll(() => page.getByRole('form', { name: /Log injection point/ }).isVisible()).toBe(true);
    await stack.shot(page, 'crew-started');

    // Three points, one with a photo from the camera.
    const jpeg = await sharp({ create: { width: 800, height: 600, channels: 3, background: '#7d6a52' } })
      .jpeg()
      .toBuffer();
    await logPoint(page, 1, '14.5', /Material came back to the surface/);
    await logPoint(page, 2, '16', /Lift seen/, jpeg);
    await logPoint(page, 3, '18', /Planned quantity reached/);
    await expect.poll(() => page.getByText('Every row is sent').isVisible()).toBe(true);
    await expect.poll(() => page.getByTestId('log-row').count()).toBe(3);
    await stack.shot(page, 'crew-three-points');

    // The signal drops while point 4 is logged: it waits on the phone.
    await ctx.setOffline(true);
    await logPoint(page, 4, '12.5', /Material came back to the surface/);
    await expect.poll(() => page.getByText('Waiting to send (1)').isVisible()).toBe(true);
    await expect.poll(() => page.getByTestId('log-row').count()).toBe(4);
    await stack.shot(page, 'crew-offline-waiting');

    // The signal is back: the row goes by itself.
    await ctx.setOffline(false);
    await expect.poll(() => page.getByText('Every row is sent').isVisible(), { timeout: 30_000 }).toBe(true);
    await stack.shot(page, 'crew-back-online');

    // Every row reached the office, once each; the photo is on point 2.
    const crewApi = await apiAs(stack, lead.email, lead.password);
    const log = await crewApi.get<{
      entries: { number: number; pounds: string; id: string }[];
      photos: { installEntryId: string | null }[];
    }>(`/jobs/${job.jobId}/log`);
    expect(log.entries.map((e) => e.number).sort()).toEqual([1, 2, 3, 4]);
    const point2 = log.entries.find((e) => e.number === 2)!;
    expect(log.photos.map((p) => p.installEntryId)).toContain(point2.id);

    // The day's note: 2 people for 10 hours on site, 20 person-hours.
    const note = page.getByRole('form', { name: 'Day note' });
    await note.getByLabel('People on site').fill('2');
    await note.getByLabel('Hours on site').fill('10');
    await expect.poll(() => note.getByLabel('Person-hours').inputValue()).toBe('20');
    await note.getByLabel('What happened today').fill('South wall done; slab came up about an inch at C.');
    await note.getByRole('button', { name: 'Save day note' }).click();
    await expect.poll(() => page.getByText('Every row is sent').isVisible()).toBe(true);
    await expect
      .poll(() =>
        page
          .getByText(/20 person-hours/)
          .first()
          .isVisible(),
      )
      .toBe(true);
    await stack.shot(page, 'crew-day-note');

    // Completion with the homeowner.
    await page.getByRole('button', { name: 'Complete the job' }).click();
    await page.waitForURL(/\/complete$/);
    await expect.poll(() => page.getByRole('heading', { name: '1. Checklist' }).isVisible()).toBe(true);
    await stack.shot(page, 'complete-checklist');
    const groups = page.getByRole('radiogroup');
    for (let i = 0; i < (await groups.count()); i++) await groups.nth(i).getByText('Yes').click();
    await page.getByRole('button', { name: 'Next' }).click();
    await expect.poll(() => page.getByLabel('Elevation (in) for point B').isVisible()).toBe(true);
    await page.getByLabel('Elevation (in) for point B').fill('-0.25');
    await page.getByLabel('Elevation (in) for point C').fill('-0.5');
    await page.getByLabel('Elevation (in) for point D').fill('-0.25');
    await stack.shot(page, 'complete-resurvey');
    await page.getByRole('button', { name: 'Next' }).click();
    await expect.poll(() => page.getByText('After (completion)').isVisible()).toBe(true);
    await stack.shot(page, 'complete-before-after');
    await page.getByRole('button', { name: 'Next' }).click();

    // Without a signature it does not go on.
    await page.getByRole('button', { name: 'Next' }).click();
    await expect
      .poll(() => page.getByText('The homeowner’s signature is needed to complete the job.').isVisible())
      .toBe(true);
    const pad = page.getByRole('img', { name: 'Signature pad' });
    await pad.scrollIntoViewIfNeeded();
    const b = (await pad.boundingBox())!;
    await page.mouse.move(b.x + 20, b.y + b.height / 2);
    await page.mouse.down();
    for (let i = 1; i <= 12; i++)
      await page.mouse.move(b.x + 20 + i * 22, b.y + b.height / 2 + (i % 2 ? -18 : 18));
    await page.mouse.up();
    await stack.shot(page, 'complete-signature');
    await page.getByRole('button', { name: 'Next' }).click();
    await expect.poll(() => page.getByText(`Signed by ${homeowner.name}`).isVisible()).toBe(true);
    await stack.shot(page, 'complete-confirm');
    await page.getByRole('button', { name: 'Complete the job' }).click();
    await page.waitForURL(new RegExp(`/jobs/${job.jobId}/field$`));
    await expect
      .poll(() => page.getByRole('heading', { name: 'Floor survey, before and after' }).isVisible())
      .toBe(true);
    await expect.poll(() => page.getByText('Completed').first().isVisible()).toBe(true);
    await stack.shot(page, 'crew-job-completed');
    await ctx.close();

    // ---- The manager, at the office.
    const manager = demo('branch_manager', 'MRW');
    const mctx = await stack.newContext(DESKTOP);
    const mpage = await mctx.newPage();
    await signIn(mpage, manager.email, manager.password);
    await mpage.getByRole('link', { name: 'Jobs' }).first().click();
    await mpage.waitForURL(/\/jobs$/);
    await expect.poll(() => mpage.getByText(homeowner.name).first().isVisible()).toBe(true);
    await stack.shot(mpage, 'manager-jobs');

    await mpage.getByRole('link', { name: job.number }).first().click();
    await mpage.waitForURL(new RegExp(`/jobs/${job.jobId}$`));
    // Hand-checked (support/field.ts PLAN): price 4340.00; actual cost 61 lb × 5.20 = 317.20, 4 points ×
    // 18 = 72, 20 person-hours × 65 = 1300, mobilisation 300 → 1989.20; margin 2350.80 / 4340 = 54.17 %.
    const margin = mpage.getByTestId('actual-margin');
    await expect.poll(() => margin.isVisible()).toBe(true);
    expect(await margin.textContent()).toMatch(/^54\.(17|2)\d*%$/);
    await stack.shot(mpage, 'manager-job-completed');

    // The warranty and its certificate.
    await mpage.getByLabel('What it covers').fill('Further settlement of the stabilised slab beyond ¼ inch.');
    await mpage.getByRole('button', { name: 'Issue warranty' }).click();
    await expect.poll(() => mpage.getByRole('button', { name: 'Certificate (PDF)' }).isVisible()).toBe(true);
    await stack.shot(mpage, 'manager-warranty');

    // The paper job sheet, on screen and as printed.
    await mpage.getByRole('button', { name: 'Job sheet' }).click();
    await mpage.waitForURL(/\/sheet$/);
    await expect.poll(() => mpage.getByRole('button', { name: 'Print' }).isVisible()).toBe(true);
    await stack.shot(mpage, 'job-sheet');
    await mpage.emulateMedia({ media: 'print' });
    await stack.shot(mpage, 'job-sheet-print');
    await mpage.emulateMedia({ media: 'screen' });

    // The jobs at risk: the permit clock of the job signed 26 days ago with a 15 % deposit.
    await mpage.getByRole('link', { name: 'Jobs' }).first().click();
    const riskList = mpage.getByRole('region', { name: /Jobs at risk/ });
    await expect.poll(() => riskList.getByText(atRisk.number).isVisible()).toBe(true);
    await stack.shot(mpage, 'manager-jobs-at-risk');

    // The calendar: the waiting job dragged onto the pier crew's Monday, beside the fresh job (a conflict).
    await mpage.getByRole('link', { name: 'Crew calendar' }).first().click();
    const crewsList = mpage.getByRole('list', { name: 'Crews' });
    await expect.poll(() => crewsList.getByTestId(`block-${job.jobId}`).isVisible()).toBe(true);
    await mpage.getByRole('button', { name: '2 weeks' }).click();
    await expect.poll(() => crewsList.getByTestId(`block-${fresh.jobId}`).isVisible()).toBe(true);
    await stack.shot(mpage, 'manager-calendar');
    const monday = nextMonday(today);
    await drag(
      mpage,
      mpage.getByTestId(`unscheduled-${atRisk.jobId}`),
      mpage.getByTestId(`cell-${pierCrewId}-${monday}`),
    );
    await expect.poll(() => mpage.getByText(`${atRisk.number} moved`).isVisible()).toBe(true);
    await expect
      .poll(() => crewsList.getByText('Conflict: crew double-booked').first().isVisible())
      .toBe(true);
    await stack.shot(mpage, 'manager-calendar-conflict');

    // Moving the fresh job to today is refused: the homeowner can still cancel.
    await drag(
      mpage,
      mpage.getByTestId(`block-${fresh.jobId}`),
      mpage.getByTestId(`cell-${foamCrewId}-${today}`),
    );
    await expect
      .poll(() => mpage.getByText('The homeowner can still cancel.').first().isVisible())
      .toBe(true);
    await stack.shot(mpage, 'manager-calendar-refused');

    // The quick edit does the same as a drag: the fresh job down to one day.
    await mpage.getByRole('button', { name: new RegExp(`^${fresh.number}, Ferris Quennell`) }).click();
    const dialog = mpage.getByRole('dialog');
    await dialog.getByLabel('Working days').fill('1');
    await stack.shot(mpage, 'manager-calendar-quick-edit');
    await dialog.getByRole('button', { name: 'Save schedule' }).click();
    await expect.poll(() => mpage.getByText(`${fresh.number} scheduled`).isVisible()).toBe(true);
    // …and takes it off the calendar again, after a confirmation.
    await mpage.getByRole('button', { name: new RegExp(`^${fresh.number}, Ferris Quennell`) }).click();
    await mpage.getByRole('dialog').getByRole('button', { name: 'Unschedule' }).click();
    await stack.shot(mpage, 'manager-calendar-unschedule-confirm');
    await mpage.getByRole('dialog').getByRole('button', { name: 'Yes, unschedule' }).click();
    await expect.poll(() => mpage.getByTestId(`unscheduled-${fresh.jobId}`).isVisible()).toBe(true);

    // The fresh job: the homeowner may still cancel. The waiver is explained, and the default is to wait.
    await mpage.goto(`/jobs/${fresh.jobId}`);
    await expect.poll(() => mpage.getByText('The homeowner can still cancel').first().isVisible()).toBe(true);
    await stack.shot(mpage, 'manager-job-inside-window');
    await mpage.getByRole('button', { name: 'Record an emergency waiver…' }).click();
    await expect.poll(() => mpage.getByText(/bona fide immediate personal emergency/).isVisible()).toBe(true);
    await stack.shot(mpage, 'manager-waiver-dialog');
    await mpage.getByRole('button', { name: 'Wait for the window to close' }).click();

    // The job at risk: the permit applied for today, and its clock is met.
    await mpage.goto(`/jobs/${atRisk.jobId}`);
    await mpage.getByRole('button', { name: 'Edit permit' }).click();
    await mpage.getByRole('button', { name: 'Needed', exact: true }).click();
    await mpage.getByLabel('Applied on').fill(today);
    await stack.shot(mpage, 'manager-permit-form');
    await mpage.getByRole('button', { name: 'Save permit' }).click();
    await expect.poll(() => mpage.getByText('Permit saved').isVisible()).toBe(true);
    await stack.shot(mpage, 'manager-permit-saved');

    // The margins by salesperson, and the crews.
    await mpage.getByRole('link', { name: 'Jobs' }).first().click();
    await mpage.getByRole('button', { name: 'Actual margins' }).click();
    await expect.poll(() => mpage.getByText(demo('salesperson', 'MRW').name).first().isVisible()).toBe(true);
    await stack.shot(mpage, 'manager-actual-margins');
    await mpage.getByRole('link', { name: 'Crews' }).first().click();
    await expect.poll(() => mpage.getByText('Marrowfield foam crew').first().isVisible()).toBe(true);
    await stack.shot(mpage, 'manager-crews');
    await mpage.getByRole('button', { name: 'Edit Marrowfield foam crew' }).click();
    await stack.shot(mpage, 'manager-crew-edit');
    await mctx.close();

    // The salesperson follows the job, read only.
    const seller = demo('salesperson', 'MRW');
    const sctx = await stack.newContext(DESKTOP);
    const spage = await sctx.newPage();
    await signIn(spage, seller.email, seller.password);
    await spage.goto(`/jobs/${job.jobId}`);
    await expect.poll(() => spage.getByText(/Read only: you follow this job/).isVisible()).toBe(true);
    expect(await spage.getByRole('button', { name: 'Issue warranty' }).count()).toBe(0);
    expect(await spage.getByRole('button', { name: 'Field log' }).count()).toBe(0);
    await stack.shot(spage, 'salesperson-job-read-only');
    await sctx.close();
  });
});
