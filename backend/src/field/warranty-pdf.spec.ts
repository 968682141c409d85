import { describe, expect, it } from 'vitest';
import { WARRANTY_CAUTION } from '@loambook/common';
import { renderWarrantyPdf, type WarrantyCertificateModel } from './warranty-pdf';

/** Pages of a PDF: page objects are dictionaries, never inside compressed streams. */
const pageCount = (pdf: Buffer) => (pdf.toString('latin1').match(/\/Type \/Page\b/g) ?? []).length;

const model = (over: Partial<WarrantyCertificateModel> = {}): WarrantyCertificateModel => ({
  number: 'W-TST-0001',
  issuedOn: '2026-07-20',
  endsOn: '2036-07-20',
  termYears: 10,
  covers: 'Settlement of the stabilised slab area along the east wall.',
  exclusions: null,
  transferable: false,
  branch: {
    name: 'Invented Foundations',
    addressLine1: '1 Clayfield Row',
    city: 'Testerton',
    state: 'FL',
    postalCode: '32000',
    phone: '555-0142',
  },
  homeownerName: 'Jordan Example',
  property: { addressLine1: '12 Settling Lane', city: 'Testerton', state: 'FL', postalCode: '32000' },
  jobNumber: 'TST-J2607-001',
  completedOn: '2026-07-20',
  work: [{ description: 'Polyurethane foam, per lb', quantity: '240.000', unit: 'lb' }],
  installed: ['14 injection points, 300.5 lb of material in all'],
  caution: WARRANTY_CAUTION,
  ...over,
});

describe('renderWarrantyPdf', () => {
  it('draws a one-page certificate', async () => {
    const pdf = await renderWarrantyPdf(model());
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(pageCount(pdf)).toBe(1);
    expect(pdf.toString('latin1')).toContain('Warranty certificate W-TST-0001');
  });

  it('runs onto more pages when the terms are long, characters outside Lato replaced', async () => {
    const pdf = await renderWarrantyPdf(
      model({
        covers: 'Covered ≥ 10 years → transferable. '.repeat(110).slice(0, 4000),
        exclusions: 'Not covered: '.repeat(300).slice(0, 4000),
        work: Array.from({ length: 30 }, (_, i) => ({
          description: `Helical pile ${i + 1}`,
          quantity: '1',
          unit: 'each',
        })),
      }),
    );
    expect(pageCount(pdf)).toBeGreaterThan(1);
  });
});
