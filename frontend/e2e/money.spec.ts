import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { addCalendarDays, todayInZone, toMinorUnits } from '@loambook/common';
import { demo, DESKTOP, PHONE, signIn, startStack, type Stack } from './support/stack';
import { apiAs, makeSignedJob, sql, type FieldJob } from './support/field';

/**
 * Issue #5's journey: the salesperson asks for the deposit of a signed contract (set up through the API);
 * the homeowner opens the link from the e-mail and pays on the card processor's page (the local fake) —
 * a declined card first, then a good one; the signed webhook records it; the bookkeeper sees the entry in
 * the journal and the trial balance in balance; nothing is earned while the homeowner may still cancel;
 * the server's clock moves past the last day to cancel (a restart with a later TEST_NOW); the earning
 * check earns the commission; the statement is built, approved and paid; the processor pays out; and the
 * bookkeeper uploads the bank's CSV, chooses its columns, and reconciles the payout and the commission
 * payment, the bank's unrelated line left unmatched.
 *
 * Check values, by hand:
 * - The contract: support/field.ts PLAN, 4340.00 with no tax; deposit 651.00.
 * - The processor's fee on a card charge: 2.9 % + 30¢ (Stripe's published standard US card price,
 *   stripe.com/pricing; the fake charges the same, backend/fakes/stripe/README.md "Money"), the percentage
 *   rounded half up to the cent: 651.00 × 0.029 = 18.879 → 18.88, + 0.30 = 19.18; net 651.00 − 19.18 =
 *   631.82, and the payout of that one charge is 631.82.
 * - The commission: the journey's own plan (invented): 10 % flat of the net price, half earned when the
 *   deposit has cleared and the window has closed: 4340.00 × 10 % = 434.00, half = 217.00.
 */
describe('journey: deposit by card to a reconciled payout', () => {
  let stack: Stack;
  let job: FieldJob;
  let mrw: { id: string; code: string; timezone: string };
  const homeowner = { name: 'Wendeline Ashgrove', email: `wendeline.ashgrove.${Date.now()}@example.com` };
  const DEPOSIT = '651.00';
  const FEE = '19.18';
  const NET = '631.82';
  const FIRST_COMMISSION = '217.00';

  beforeAll(async () => {
    stack = await startStack('money');
    const owner = await apiAs(stack, demo('owner').email, demo('owner').password);
    const seller = await apiAs(stack, demo('salesperson', 'MRW').email, demo('salesperson', 'MRW').password);
    const branches = await owner.get<{ id: string; code: string; timezone: string }[]>('/branches');
    mrw = branches.find((b) => b.code === 'MRW')!;
    // The owner's plan for the branch, from today: the demo's older contracts stay outside it.
    await owner.send('POST', '/commission-plans', {
      branchId: mrw.id,
      name: 'Marrowfield flat 10 %',
      basis: 'net_price',
      rate: { kind: 'flat', ratePct: '10' },
      firstMilestonePct: '50',
      effectiveFrom: todayInZone(mrw.timezone),
    });
    job = await makeSignedJob(stack, seller, mrw.id, { ...homeowner, street: '3 Quillfeather Lane' });
  });
  afterAll(() => stack?.close());

  const toast = (page: Page, text: string | RegExp) =>
    expect.poll(() => page.locator('.p-toast').getByText(text).first().isVisible()).toBe(true);

  /** Lets dialogs and messages finish coming in (endless spinners aside; 1.5 s at most), then shoots. */
  async function shot(page: Page, name: string) {
    await page.evaluate(async () => {
      const wait = (ms: number) => new Promise((r) => setTimeout(r, ms));
      await wait(50);
      const running = document
        .getAnimations()
        .filter((a) => {
          const end = a.effect?.getComputedTiming().endTime;
          return a.playState === 'running' && typeof end === 'number' && Number.isFinite(end);
        })
        .map((a) => a.finished.catch(() => undefined));
      await Promise.race([Promise.all(running), wait(1500)]);
    });
    await stack.shot(page, name);
    await dismissToasts(page);
  }

  /** The messages on screen are read: closed, so that they do not cover the next picture. */
  async function dismissToasts(page: Page) {
    const close = page.locator('.p-toast .p-toast-icon-close');
    for (let i = (await close.count()) - 1; i >= 0; i--) {
      await close
        .nth(i)
        .click({ timeout: 1000 })
        .catch(() => undefined);
    }
  }

  async function choose(page: Page, label: string, option: string | RegExp) {
    // The last list still fading out holds the same options: wait until it has gone.
    await expect.poll(() => page.locator('.p-dropdown-panel').count()).toBe(0);
    await page.getByLabel(label, { exact: true }).click();
    // The overlay's option, not the hidden native select's (which holds the chosen one too).
    await page.locator('.p-dropdown-panel').getByRole('option', { name: option }).click();
    await expect.poll(() => page.locator('.p-dropdown-panel').count()).toBe(0);
  }

  /** What a dropdown shows as chosen. */
  const chosen = (page: Page, label: string) =>
    page
      .locator('.p-dropdown', { has: page.getByLabel(label, { exact: true }) })
      .locator('.p-dropdown-label')
      .innerText();

  const mdy = (day: string) => `${day.slice(5, 7)}/${day.slice(8, 10)}/${day.slice(0, 4)}`;

  it('takes the deposit, earns and pays the commission, and reconciles the bank', async () => {
    expect(job.price).toBe('4340.00');

    // ---- The salesperson asks for the deposit from the lead page.
    const seller = demo('salesperson', 'MRW');
    const sctx = await stack.newContext(DESKTOP, { timezoneId: mrw.timezone });
    const spage = await sctx.newPage();
    await signIn(spage, seller.email, seller.password);
    await spage.goto(`/leads/${job.leadId}`);
    const panel = spage.getByRole('region', { name: 'Payments' });
    await expect.poll(() => panel.getByRole('button', { name: 'Request deposit' }).isVisible()).toBe(true);
    await shot(spage, 'seller-lead-payments');
    await panel.getByRole('button', { name: 'Request deposit' }).click();
    const linkDialog = spage.getByRole('dialog');
    await expect.poll(() => linkDialog.getByLabel('Deposit amount').inputValue()).toBe(DEPOSIT);
    await shot(spage, 'seller-deposit-link-dialog');
    await linkDialog.getByRole('button', { name: 'Make the link' }).click();
    await toast(spage, 'Payment link made');
    await expect.poll(() => panel.getByText('Waiting for payment').first().isVisible()).toBe(true);
    await shot(spage, 'seller-deposit-link-made');

    // ---- The homeowner, on a phone, opens the link from the e-mail.
    await expect
      .poll(() => stack.mail.inbox.some((m) => m.to === homeowner.email && /Deposit for/.test(m.subject)))
      .toBe(true);
    const mail = stack.mail.inbox.find((m) => m.to === homeowner.email && /Deposit for/.test(m.subject))!;
    const link = mail.text.match(/https?:\/\/\S+\/pay\/cs_\w+/)?.[0];
    expect(link, mail.text).toBeTruthy();
    expect(link!.startsWith(stack.stripe.url)).toBe(true);
    expect(mail.text).toContain('$651.00');
    const hctx = await stack.newContext(PHONE, { timezoneId: mrw.timezone });
    const hpage = await hctx.newPage();
    await hpage.goto(link!);
    await expect.poll(() => hpage.getByTestId('amount-total').textContent()).toBe('$651.00');
    await shot(hpage, 'homeowner-payment-page');

    const payWith = async (card: string) => {
      await hpage.getByLabel('Card number').fill(card);
      await hpage
        .getByLabel('Expiry date (MM / YY)')
        .fill(`12 / ${String(new Date().getFullYear() + 3).slice(2)}`);
      await hpage.getByLabel('Security code (CVC)').fill('123');
      await hpage.getByLabel('Name on card').fill(homeowner.name);
      await hpage.getByRole('button', { name: 'Pay $651.00' }).click();
    };
    // The processor's published test cards (Stripe's testing docs; the fake's README "Test cards"): this
    // one is always declined…
    await payWith('4000 0000 0000 0002');
    await expect.poll(() => hpage.getByTestId('payment-error').textContent()).toBe('Your card was declined.');
    await shot(hpage, 'homeowner-card-declined');
    expect(
      (await sql(stack, 'select count(*)::int as n from payments where contract_id = ?', [job.contractId]))
        .rows[0],
    ).toEqual({ n: 0 });

    // …and this one approved; the processor sends the homeowner back to our thank-you page.
    await payWith('4242 4242 4242 4242');
    await hpage.waitForURL(/\/payment\/thank-you\?session_id=cs_/);
    await expect
      .poll(() => hpage.getByRole('heading', { name: 'Thank you: payment received' }).isVisible())
      .toBe(true);
    await shot(hpage, 'homeowner-thank-you');
    await hctx.close();

    // The signed webhook recorded the charge once, with the processor's fee.
    await expect
      .poll(
        async () =>
          (await sql(stack, 'select amount, fee, net from payments where contract_id = ?', [job.contractId]))
            .rows,
      )
      .toEqual([{ amount: DEPOSIT, fee: FEE, net: NET }]);
    const charge = [...stack.stripe.state.charges.values()].find((c) => c.status === 'succeeded')!;
    expect(charge).toBeTruthy();

    // The salesperson's panel shows it in.
    await spage.reload();
    await expect.poll(() => panel.getByRole('cell', { name: '$651.00' }).first().isVisible()).toBe(true);
    await expect.poll(() => panel.getByText('Paid').first().isVisible()).toBe(true);
    await shot(spage, 'seller-deposit-received');
    await sctx.close();

    // ---- The bookkeeper: the deposit's entry in the journal, and the trial balance.
    const keeper = demo('bookkeeper');
    const bctx = await stack.newContext(DESKTOP, { timezoneId: mrw.timezone });
    const bpage = await bctx.newPage();
    await signIn(bpage, keeper.email, keeper.password);
    await bpage.getByRole('link', { name: 'Journal' }).first().click();
    await bpage.waitForURL(/\/ledger\/journal/);
    await choose(bpage, 'Reason', 'Deposit paid by card');
    const today = todayInZone(mrw.timezone);
    await bpage.getByLabel('From', { exact: true }).fill(today);
    const head = bpage.locator('tr', { hasText: `charge ${charge.id}` });
    await expect.poll(() => head.isVisible()).toBe(true);
    const lines = head.locator('xpath=following-sibling::tr[position() <= 3]');
    expect(await lines.allInnerTexts()).toEqual([
      expect.stringMatching(/Card processor clearing[\s\S]*\$631\.82/),
      expect.stringMatching(/Card processing fees[\s\S]*\$19\.18/),
      expect.stringMatching(/Customer deposits \(contract liability\)[\s\S]*\$651\.00/),
    ]);
    // Clearing and the fee on the debit side, the deposit on the credit side.
    expect(await lines.nth(0).locator('td').nth(2).innerText()).toBe('$631.82');
    expect(await lines.nth(1).locator('td').nth(2).innerText()).toBe('$19.18');
    expect(await lines.nth(2).locator('td').nth(3).innerText()).toBe('$651.00');
    await head.scrollIntoViewIfNeeded();
    await shot(bpage, 'bookkeeper-journal-deposit');

    await bpage.getByRole('link', { name: 'Trial balance' }).first().click();
    await bpage.waitForURL(/\/ledger\/trial-balance/);
    await expect.poll(() => bpage.getByText('Balanced.').isVisible()).toBe(true);
    await shot(bpage, 'bookkeeper-trial-balance');

    // Nothing is earned while the homeowner may still cancel, although the deposit has cleared.
    await bpage.getByRole('link', { name: 'Statements' }).first().click();
    await bpage.waitForURL(/\/commissions\/statements/);
    await bpage.getByRole('button', { name: 'Run earning check' }).click();
    await toast(bpage, /^0 new lines: \$0\.00 earned/);
    await shot(bpage, 'bookkeeper-earning-inside-window');
    expect(
      (
        await sql(stack, 'select count(*)::int as n from commission_lines where contract_id = ?', [
          job.contractId,
        ])
      ).rows[0],
    ).toEqual({ n: 0 });

    // ---- The clock moves past the last day to cancel: the server restarts with a later "now", and the
    // processor's clock keeps step with it (for its payout's arrival date).
    const contract = (
      await sql(
        stack,
        `select to_char(last_day_to_cancel, 'YYYY-MM-DD') as day from contracts where id = ?`,
        [job.contractId],
      )
    ).rows[0] as { day: string };
    const closedOn = addCalendarDays(contract.day, 1);
    const later = new Date(`${closedOn}T17:00:00Z`); // midday on the branch's clock (America/New_York)
    await stack.restartServer({ TEST_NOW: later.toISOString() });
    stack.stripe.configure({ clockOffsetSec: Math.ceil((later.getTime() - Date.now()) / 1000) });

    await bpage.reload();
    await bpage.getByRole('button', { name: 'Run earning check' }).click();
    await toast(bpage, /new lines?: \$[\d,.]+ earned/);
    await expect
      .poll(
        async () =>
          (
            await sql(
              stack,
              `select milestone, kind, amount, to_char(effective_on, 'YYYY-MM-DD') as day from commission_lines where contract_id = ?`,
              [job.contractId],
            )
          ).rows,
      )
      .toEqual([
        {
          milestone: 'deposit_cleared_window_closed',
          kind: 'earning',
          amount: FIRST_COMMISSION,
          day: closedOn,
        },
      ]);
    await shot(bpage, 'bookkeeper-earning-after-window');

    // The statements of the pay period holding the day the window closed.
    await bpage.getByRole('button', { name: 'Build statements…' }).click();
    const build = bpage.getByRole('dialog');
    await build.getByLabel('A day of the pay period').fill(closedOn);
    await shot(bpage, 'bookkeeper-build-statements');
    await build.getByRole('button', { name: 'Build', exact: true }).click();
    await toast(bpage, /placed on \d+ draft statements?\./);
    const row = bpage.locator('tr', { hasText: seller.name });
    await expect.poll(() => row.first().isVisible()).toBe(true);
    await shot(bpage, 'bookkeeper-statements');
    await row.first().getByRole('link').first().click();
    await bpage.waitForURL(/\/commissions\/statements\/[0-9a-f-]{36}$/);
    const statementId = bpage.url().split('/').pop()!;
    const ourLine = bpage
      .getByRole('table', { name: 'Statement lines' })
      .locator('tr', { hasText: homeowner.name });
    await expect.poll(() => ourLine.isVisible()).toBe(true);
    expect(await ourLine.innerText()).toMatch(/Deposit cleared, cancellation window closed[\s\S]*\$217\.00/);
    await shot(bpage, 'bookkeeper-statement-draft');

    await bpage.getByRole('button', { name: 'Approve…' }).click();
    await shot(bpage, 'bookkeeper-statement-approve-confirm');
    await bpage.getByRole('dialog').getByRole('button', { name: 'Approve', exact: true }).click();
    await toast(bpage, 'Statement approved');
    await dismissToasts(bpage);
    await expect.poll(() => bpage.getByRole('button', { name: 'Mark paid…' }).isVisible()).toBe(true);

    await bpage.getByRole('button', { name: 'Mark paid…' }).click();
    const payForm = bpage.getByRole('form', { name: 'Mark paid' });
    await payForm.getByLabel('Paid on').fill(closedOn);
    await payForm.getByLabel('Reference').fill('ACH 20417');
    await shot(bpage, 'bookkeeper-statement-pay');
    await payForm.getByRole('button', { name: /^Mark paid \$/ }).click();
    await toast(bpage, 'Statement paid');
    await expect.poll(() => bpage.getByText(/Paid on .*ACH 20417/).isVisible()).toBe(true);
    await shot(bpage, 'bookkeeper-statement-paid');
    const statement = (
      await sql(stack, 'select payable, status from commission_statements where id = ?', [statementId])
    ).rows[0] as { payable: string; status: string };
    expect(statement.status).toBe('paid');
    const commissionBankDay = addCalendarDays(closedOn, 1);

    // ---- The processor pays out the day's charge; its payout.paid webhook is recorded and posted.
    const [payout] = stack.stripe.payoutNow();
    expect(payout).toBeTruthy();
    expect(String(payout!.amount)).toBe(toMinorUnits(NET));
    const arrival = new Date(payout!.arrival_date * 1000).toISOString().slice(0, 10);
    expect(arrival).toBe(addCalendarDays(closedOn, 1));
    await expect
      .poll(
        async () =>
          (
            await sql(
              stack,
              `select amount, to_char(arrival_date, 'YYYY-MM-DD') as arrival from processor_payouts where processor_payout_id = ?`,
              [payout!.id],
            )
          ).rows,
      )
      .toEqual([{ amount: NET, arrival }]);

    // ---- The bank account, and its statement as the bank exports it (CSV written here).
    await bpage.getByRole('link', { name: 'Reconciliation' }).first().click();
    await bpage.waitForURL(/\/reconciliation/);
    await expect.poll(() => bpage.getByText('No bank accounts yet').isVisible()).toBe(true);
    await shot(bpage, 'bookkeeper-reconciliation-empty');
    await bpage.getByRole('link', { name: 'Bank accounts' }).first().click();
    await bpage.getByRole('button', { name: 'New bank account' }).click();
    const accountDialog = bpage.getByRole('dialog');
    await accountDialog.getByLabel('Name', { exact: true }).fill('Operating');
    await accountDialog.getByLabel('Last four digits').fill('4417');
    await shot(bpage, 'bookkeeper-new-bank-account');
    await accountDialog.getByRole('button', { name: 'Add account' }).click();
    await expect
      .poll(() => bpage.getByRole('link', { name: /Upload a statement to/ }).isVisible())
      .toBe(true);
    await shot(bpage, 'bookkeeper-bank-accounts');
    await bpage.getByRole('link', { name: /Upload a statement to/ }).click();
    await bpage.waitForURL(/\/reconciliation\/upload/);

    const unrelatedDay = closedOn;
    const csv = [
      'Posted,Narrative,Withdrawn,Deposited,Running balance',
      `${mdy(unrelatedDay)},MARROWFIELD WATER DEPT AUTOPAY,86.40,,12413.60`,
      `${mdy(arrival)},CARD PROCESSOR TRANSFER ${payout!.id},,${NET},13045.42`,
      `${mdy(commissionBankDay)},ACH DEBIT COMMISSION ${seller.name.toUpperCase()},${statement.payable},,${'12828.42'}`,
      '',
    ].join('\r\n');
    await bpage
      .locator('#upload-file')
      .setInputFiles({ name: 'operating-4417.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
    await bpage.getByRole('button', { name: 'Read the file' }).click();
    await expect
      .poll(() => bpage.getByRole('heading', { name: 'Choose the columns' }).isVisible())
      .toBe(true);
    await shot(bpage, 'bookkeeper-upload-read');
    // "Posted" is not a date column name the guess knows: the rest is guessed, the date chosen by hand.
    await expect.poll(() => bpage.getByText('Some column names were recognised').isVisible()).toBe(true);
    expect(await chosen(bpage, 'Description column')).toBe('B · Narrative');
    expect(await chosen(bpage, 'Debit (money out) column')).toBe('C · Withdrawn');
    expect(await chosen(bpage, 'Credit (money in) column')).toBe('D · Deposited');
    await choose(bpage, 'Date column', /^A · Posted$/);
    // Dates whose day is 12 or less read both ways (12/06: 6 December or 12 June): then the format is
    // asked for; otherwise only month/day/year fits and is chosen with the column.
    const ambiguous = [unrelatedDay, arrival, commissionBankDay].every((d) => Number(d.slice(8, 10)) <= 12);
    if (ambiguous) {
      await expect
        .poll(() =>
          bpage.getByText('Every date shown reads as month/day/year or as day/month/year').isVisible(),
        )
        .toBe(true);
    } else {
      expect(await chosen(bpage, 'Dates are written')).toBe('Month/day/year (11/04/2026)');
    }
    await choose(bpage, 'Dates are written', /^Month\/day\/year/);
    await expect.poll(() => bpage.getByText('Every row reads.').isVisible()).toBe(true);
    await expect.poll(() => bpage.getByRole('button', { name: 'Store 3 lines' }).isEnabled()).toBe(true);
    await shot(bpage, 'bookkeeper-upload-columns');
    await bpage.getByRole('button', { name: 'Store 3 lines' }).click();
    await expect.poll(() => bpage.getByRole('heading', { name: 'Statement stored' }).isVisible()).toBe(true);
    await shot(bpage, 'bookkeeper-upload-stored');

    // ---- Matching: the payout and the commission payment; the water bill stays unmatched.
    await bpage.getByRole('link', { name: 'Reconcile this period' }).click();
    await bpage.waitForURL(/\/reconciliation\?/);
    await expect.poll(() => bpage.getByRole('button', { name: 'Suggest matches' }).isEnabled()).toBe(true);
    await shot(bpage, 'bookkeeper-reconciliation-before');
    await bpage.getByRole('button', { name: 'Suggest matches' }).click();
    await toast(bpage, '2 matches suggested');
    const matched = bpage.getByRole('table', { name: 'Matched pairs' });
    const payoutRow = matched.locator('tr', { hasText: `Payout ${payout!.id}` });
    const commissionRow = matched.locator('tr', { hasText: `Commission to ${seller.name}` });
    await expect.poll(() => payoutRow.isVisible()).toBe(true);
    expect(await payoutRow.innerText()).toMatch(/\$631\.82[\s\S]*same day[\s\S]*Suggested/);
    expect(await commissionRow.innerText()).toMatch(/−?-?\$217\.00[\s\S]*\+1 d[\s\S]*Suggested/);
    await shot(bpage, 'bookkeeper-matches-suggested');
    await payoutRow.getByRole('button', { name: /^Confirm the match of/ }).click();
    await expect.poll(() => payoutRow.getByText('Confirmed').isVisible()).toBe(true);
    await commissionRow.getByRole('button', { name: /^Confirm the match of/ }).click();
    await expect.poll(() => commissionRow.getByText('Confirmed').isVisible()).toBe(true);

    const bankSide = bpage.getByRole('region', { name: /On the bank, not matched/ });
    await expect.poll(() => bankSide.getByText('MARROWFIELD WATER DEPT AUTOPAY').isVisible()).toBe(true);
    expect(await bankSide.locator('.unmatched__item').count()).toBe(1);
    expect(await bankSide.locator('.unmatched__item').innerText()).toMatch(/-?−?\$86\.40/);
    await shot(bpage, 'bookkeeper-matches-confirmed');
    expect(
      (await sql(stack, `select target_kind, status from reconciliation_matches order by target_kind`)).rows,
    ).toEqual([
      { target_kind: 'commission_payment', status: 'confirmed' },
      { target_kind: 'payout', status: 'confirmed' },
    ]);

    // The payout, opened from its match: the charge inside it with its fee.
    await payoutRow.getByRole('link', { name: `Payout ${payout!.id}` }).click();
    await bpage.waitForURL(/\/payouts\/[0-9a-f-]{36}$/);
    await expect.poll(() => bpage.getByText('$19.18').first().isVisible()).toBe(true);
    await shot(bpage, 'bookkeeper-payout-breakdown');

    // The books still balance on the payout's day, after the payout and the commission.
    await bpage.getByRole('link', { name: 'Trial balance' }).first().click();
    await bpage.getByLabel('As of').fill(arrival);
    await expect.poll(() => bpage.getByText('Balanced.').isVisible()).toBe(true);
    await shot(bpage, 'bookkeeper-trial-balance-end');
    await bctx.close();
  });
});
