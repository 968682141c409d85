import { describe, expect, it, vi } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEventBase from '@testing-library/user-event';
import type { BankStatement, BankStatementPreview } from '@loambook/common';
import { fakeApi } from '@/testing/fake-api';
import { makeUser, renderApp, signInAs } from '@/testing/render';
import { ACCOUNT, PREVIEW } from '../testing/fixtures';
import UploadStatementRoute from './upload-statement';

const userEvent = userEventBase.setup({ pointerEventsCheck: 0 });
const visibleList = { hidden: true } as const;

interface Sent {
  url: string;
  fields: Record<string, string>;
}

/** XMLHttpRequest as the multipart upload uses it, answering from a table of routes. */
function fakeXhr(
  routes: Record<string, (fields: Record<string, string>) => { status: number; body: unknown }>,
) {
  const sent: Sent[] = [];
  class FakeXhr {
    upload: {
      onprogress: ((e: { lengthComputable: boolean; loaded: number; total: number }) => void) | null;
    } = {
      onprogress: null,
    };
    status = 0;
    responseText = '';
    onload: (() => void) | null = null;
    onerror: (() => void) | null = null;
    private url = '';
    open(_method: string, url: string) {
      this.url = url;
    }
    setRequestHeader() {}
    send(form: FormData) {
      const fields: Record<string, string> = {};
      form.forEach((v, k) => {
        if (typeof v === 'string') fields[k] = v;
      });
      sent.push({ url: this.url, fields });
      const answer = routes[this.url]?.(fields) ?? {
        status: 404,
        body: { code: 'ROUTE.NOT_FOUND', message: 'x' },
      };
      this.upload.onprogress?.({ lengthComputable: true, loaded: 10, total: 10 });
      setTimeout(() => {
        this.status = answer.status;
        this.responseText = JSON.stringify(answer.body);
        this.onload?.();
      }, 0);
    }
  }
  vi.stubGlobal('XMLHttpRequest', FakeXhr);
  return sent;
}

const WITH_ERRORS: BankStatementPreview = {
  ...PREVIEW,
  check: {
    lineCount: 2,
    errorCount: 1,
    errors: [
      { rowNumber: 4, field: 'debit', code: 'BANK_CSV.AMOUNT_INVALID', message: '"abc" is not an amount.' },
    ],
    periodFrom: '2026-11-04',
    periodTo: '2026-11-14',
    moneyIn: '2129.80',
    moneyOut: '1800.00',
  },
};

const STORED: BankStatement = {
  id: 's-1',
  bankAccountId: ACCOUNT.id,
  bankAccountName: 'Operating',
  fileName: 'nov.csv',
  sha256: 'f'.repeat(64),
  periodFrom: '2026-11-04',
  periodTo: '2026-11-14',
  rowCount: 4,
  lineCount: 2,
  skippedRows: WITH_ERRORS.check!.errors,
  mapping: PREVIEW.mapping!,
  moneyIn: '2129.80',
  moneyOut: '1800.00',
  matchedCount: 0,
  uploadedBy: { id: 'u-b', name: 'Bea Keeper' },
  uploadedAt: '2026-12-02T10:00:00Z',
};

async function chooseAccountAndFile() {
  await userEvent.click(await screen.findByLabelText('Bank account'));
  await userEvent.click(await screen.findByRole('option', { name: /Operating ··0142/, ...visibleList }));
  const file = new File(['Posting Date,Description,Debit,Credit\n'], 'nov.csv', { type: 'text/csv' });
  await userEvent.upload(screen.getByLabelText('Statement file (CSV)'), file);
}

describe('uploading a bank statement', () => {
  it('asks for the account and the file before reading anything', async () => {
    signInAs(makeUser('bookkeeper'));
    fakeApi({ 'GET /api/bank-accounts': { body: [ACCOUNT] } });
    const sent = fakeXhr({});
    renderApp(<UploadStatementRoute />);
    await userEvent.click(await screen.findByRole('button', { name: 'Read the file' }));
    expect(screen.getByLabelText('Bank account')).toHaveAccessibleDescription(/Choose the bank account/);
    expect(screen.getByLabelText('Statement file (CSV)')).toHaveAccessibleDescription(/Choose the CSV file/);
    expect(sent).toHaveLength(0);
  });

  it('shows the rows that cannot be read, and stores the rest only when told to skip them', async () => {
    signInAs(makeUser('bookkeeper'));
    fakeApi({ 'GET /api/bank-accounts': { body: [ACCOUNT] } });
    const sent = fakeXhr({
      '/api/bank-statements/preview': () => ({ status: 200, body: WITH_ERRORS }),
      '/api/bank-statements': () => ({ status: 201, body: STORED }),
    });
    renderApp(<UploadStatementRoute />);
    await chooseAccountAndFile();
    await userEvent.click(screen.getByRole('button', { name: 'Read the file' }));

    expect(await screen.findByRole('heading', { name: 'Choose the columns' })).toBeInTheDocument();
    expect(sent[0]).toEqual({ url: '/api/bank-statements/preview', fields: { bankAccountId: ACCOUNT.id } });
    const problems = await screen.findByRole('table', { name: /Rows that cannot be read/ });
    const row = within(problems).getAllByRole('row')[1]!;
    expect(row).toHaveTextContent('4');
    expect(row).toHaveTextContent('Debit');
    expect(row).toHaveTextContent('"abc" is not an amount.');
    const store = screen.getByRole('button', { name: 'Store 2 lines' });
    expect(store).toBeDisabled();

    await userEvent.click(screen.getByLabelText(/Skip the rows that cannot be read/));
    await userEvent.click(store);
    expect(await screen.findByText(/2 lines from nov.csv stored on Operating/)).toBeInTheDocument();
    const upload = sent.find((s) => s.url === '/api/bank-statements')!;
    expect(upload.fields).toMatchObject({ bankAccountId: ACCOUNT.id, skipInvalidRows: 'true' });
    expect(JSON.parse(upload.fields.mapping!)).toEqual(PREVIEW.mapping);
    expect(screen.getByText(/remembered for the next upload/)).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Reconcile this period' })).toHaveAttribute(
      'href',
      `/reconciliation?account=${ACCOUNT.id}&from=2026-11-01&to=2026-11-14`,
    );
  });

  it('says when the same file was uploaded before, and does not offer to store it', async () => {
    signInAs(makeUser('bookkeeper'));
    fakeApi({ 'GET /api/bank-accounts': { body: [ACCOUNT] } });
    fakeXhr({
      '/api/bank-statements/preview': () => ({
        status: 200,
        body: {
          ...PREVIEW,
          check: { ...WITH_ERRORS.check!, errorCount: 0, errors: [] },
          duplicateOf: { statementId: 's-0', fileName: 'november.csv', uploadedAt: '2026-12-01T09:00:00Z' },
        },
      }),
    });
    renderApp(<UploadStatementRoute />);
    await chooseAccountAndFile();
    await userEvent.click(screen.getByRole('button', { name: 'Read the file' }));
    expect(
      await screen.findByText(/This very file was uploaded to Operating ··0142 already \(november.csv/),
    ).toBeInTheDocument();
    await waitFor(() => expect(screen.getByRole('button', { name: 'Store 2 lines' })).toBeDisabled());
  });
});
