import PDFDocument from 'pdfkit';
import { PRICE_BOOK_UNIT_LABELS, weekdayDate, type PriceBookUnit } from '@loambook/common';
import { latoFonts, pdfText } from '../signing/pdf/fonts';

/** What a warranty certificate shows. */
export interface WarrantyCertificateModel {
  number: string;
  issuedOn: string;
  endsOn: string;
  termYears: number;
  covers: string;
  exclusions: string | null;
  transferable: boolean;
  branch: {
    name: string;
    addressLine1: string;
    city: string;
    state: string;
    postalCode: string;
    phone: string | null;
  };
  homeownerName: string;
  property: { addressLine1: string; city: string; state: string; postalCode: string };
  jobNumber: string;
  completedOn: string | null;
  /** The plan's lines: the work agreed. */
  work: { description: string; quantity: string; unit: string }[];
  /** What the crew's log recorded, one line each ("14 injection points, 300.5 lb of material"). */
  installed: string[];
  caution: string;
}

// US Letter, 0.75 in margins: the same page as the contract (backend/src/signing/pdf/render.ts).
const PAGE = { size: 'LETTER', margins: { top: 54, bottom: 72, left: 54, right: 54 } } as const;
const LEFT = PAGE.margins.left;
const WIDTH = 612 - PAGE.margins.left - PAGE.margins.right;
const INK = '#1a1a1a';
const MUTED = '#555555';
const RULE = '#999999';
const SHADE = '#f2f2f2';
const REGULAR = 'Lato';
const BOLD = 'Lato-Bold';

const shortDecimal = (v: string) => (v.includes('.') ? v.replace(/\.?0+$/, '') : v);

/** The homeowner's certificate, print-friendly (black on white); returns the PDF's bytes. */
export function renderWarrantyPdf(m: WarrantyCertificateModel): Promise<Buffer> {
  const doc = new PDFDocument({
    size: PAGE.size,
    margins: PAGE.margins,
    bufferPages: true,
    lang: 'en-US',
    displayTitle: true,
    info: {
      Title: `Warranty certificate ${m.number}`,
      Author: m.branch.name,
      Subject: `Warranty for ${m.homeownerName}, ${m.property.addressLine1}`,
      Creator: 'Loambook',
    },
  });
  const fonts = latoFonts();
  doc.registerFont(REGULAR, fonts.regular);
  doc.registerFont(BOLD, fonts.bold);
  const done = new Promise<Buffer>((resolve, reject) => {
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const room = (h: number) => {
    if (doc.y + h > doc.page.maxY()) {
      doc.addPage();
      doc.x = LEFT;
    }
  };
  const text = (
    s: string,
    o: { size?: number; bold?: boolean; color?: string; gap?: number; align?: 'left' | 'center' } = {},
  ) => {
    doc.font(o.bold ? BOLD : REGULAR).fontSize(o.size ?? 10);
    room(doc.heightOfString(pdfText(s), { width: WIDTH }) + 2);
    doc
      .fillColor(o.color ?? INK)
      .text(pdfText(s), LEFT, doc.y, { width: WIDTH, lineGap: 1.5, align: o.align ?? 'left' });
    if (o.gap) doc.y += o.gap;
  };
  const rule = (color = RULE) => {
    const y = doc.y + 2;
    doc
      .save()
      .lineWidth(0.6)
      .strokeColor(color)
      .moveTo(LEFT, y)
      .lineTo(LEFT + WIDTH, y)
      .stroke()
      .restore();
    doc.y = y + 6;
  };
  const heading = (s: string) => {
    room(60);
    doc.y += 10;
    text(s, { size: 13, bold: true, gap: 2 });
    rule();
  };
  const pair = (label: string, value: string, bold = false) => {
    const labelWidth = 150;
    doc.font(bold ? BOLD : REGULAR).fontSize(10);
    const h = Math.max(
      doc.heightOfString(pdfText(label), { width: labelWidth }),
      doc.heightOfString(pdfText(value), { width: WIDTH - labelWidth - 8 }),
    );
    room(h + 2);
    const y = doc.y;
    doc.fillColor(MUTED).font(REGULAR).text(pdfText(label), LEFT, y, { width: labelWidth });
    doc
      .fillColor(INK)
      .font(bold ? BOLD : REGULAR)
      .text(pdfText(value), LEFT + labelWidth + 8, y, { width: WIDTH - labelWidth - 8 });
    doc.y = y + h + 2;
  };
  const bullet = (s: string) => {
    doc.font(REGULAR).fontSize(9.5);
    const h = doc.heightOfString(pdfText(s), { width: WIDTH - 14 });
    room(h + 2);
    const y = doc.y;
    doc.fillColor(INK).text('•', LEFT + 2, y, { width: 10 });
    doc.text(pdfText(s), LEFT + 14, y, { width: WIDTH - 14, lineGap: 1.5 });
    doc.y += 1.5;
  };
  const box = (label: string, body: string) => {
    const pad = 6;
    doc.font(REGULAR).fontSize(9.5);
    const bodyH = doc.heightOfString(pdfText(body), { width: WIDTH - 2 * pad, lineGap: 1.5 });
    doc.font(BOLD).fontSize(9.5);
    const labelH = doc.heightOfString(pdfText(label), { width: WIDTH - 2 * pad }) + 2;
    const h = bodyH + labelH + 2 * pad;
    room(h + 6);
    const top = doc.y;
    doc.save().rect(LEFT, top, WIDTH, h).fillAndStroke(SHADE, RULE).restore();
    doc
      .font(BOLD)
      .fontSize(9.5)
      .fillColor(INK)
      .text(pdfText(label), LEFT + pad, top + pad, { width: WIDTH - 2 * pad });
    doc
      .font(REGULAR)
      .fontSize(9.5)
      .fillColor(INK)
      .text(pdfText(body), LEFT + pad, top + pad + labelH, { width: WIDTH - 2 * pad, lineGap: 1.5 });
    doc.y = top + h + 6;
  };

  // Header: the branch on the left, the certificate's title and number on the right.
  const b = m.branch;
  const top = doc.y;
  doc
    .font(BOLD)
    .fontSize(16)
    .fillColor(INK)
    .text(pdfText(b.name), LEFT, top, { width: WIDTH * 0.55 });
  doc.font(REGULAR).fontSize(9.5).fillColor(MUTED);
  doc.text(pdfText(`${b.addressLine1}, ${b.city}, ${b.state} ${b.postalCode}`), { width: WIDTH * 0.55 });
  if (b.phone) doc.text(pdfText(`Phone ${b.phone}`), { width: WIDTH * 0.55 });
  const leftBottom = doc.y;
  doc
    .font(BOLD)
    .fontSize(16)
    .fillColor(INK)
    .text('WARRANTY CERTIFICATE', LEFT + WIDTH * 0.55, top, { width: WIDTH * 0.45, align: 'right' });
  doc.font(REGULAR).fontSize(9.5).fillColor(MUTED);
  doc.text(pdfText(m.number), LEFT + WIDTH * 0.55, doc.y, { width: WIDTH * 0.45, align: 'right' });
  doc.text(pdfText(`Issued ${weekdayDate(m.issuedOn)}`), LEFT + WIDTH * 0.55, doc.y, {
    width: WIDTH * 0.45,
    align: 'right',
  });
  doc.y = Math.max(leftBottom, doc.y) + 4;
  doc.x = LEFT;
  rule(INK);

  heading('Homeowner and property');
  pair('Homeowner', m.homeownerName, true);
  const p = m.property;
  pair('Property', `${p.addressLine1}, ${p.city}, ${p.state} ${p.postalCode}`);
  pair('Job', m.jobNumber);
  if (m.completedOn) pair('Work completed', weekdayDate(m.completedOn));

  heading('The work');
  for (const w of m.work) {
    const unit = PRICE_BOOK_UNIT_LABELS[w.unit as PriceBookUnit] ?? w.unit;
    const plural = shortDecimal(w.quantity) !== '1' && (w.unit === 'point' || w.unit === 'hour');
    bullet(`${w.description}: ${shortDecimal(w.quantity)} ${unit}${plural ? 's' : ''} (as agreed)`);
  }
  if (m.installed.length > 0) {
    doc.y += 4;
    text('Installed, as recorded in the crew’s log:', { size: 10, bold: true, gap: 2 });
    for (const line of m.installed) bullet(line);
  }

  heading('The warranty');
  pair('Term', `${m.termYears} year${m.termYears === 1 ? '' : 's'}: from ${m.issuedOn} to ${m.endsOn}`, true);
  pair('Covers', m.covers);
  pair(
    'Does not cover',
    m.exclusions?.trim() ? m.exclusions : 'Nothing beyond what the terms above leave out.',
  );
  pair(
    'Transferable',
    m.transferable
      ? 'Yes: it passes to a later owner of the property for the rest of its term.'
      : 'No: it is for the homeowner named above only.',
  );
  pair('Issued on', weekdayDate(m.issuedOn));
  doc.y += 4;
  box('Caution', m.caution);

  // Footer on every page.
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    const y = doc.page.height - 48;
    doc.font(REGULAR).fontSize(8).fillColor(MUTED);
    doc.text(pdfText(`${b.name} · ${m.number} · ${m.homeownerName}`), LEFT, y, {
      width: WIDTH * 0.7,
      lineBreak: false,
    });
    doc.text(`Page ${i - range.start + 1} of ${range.count}`, LEFT + WIDTH * 0.7, y, {
      width: WIDTH * 0.3,
      align: 'right',
      lineBreak: false,
    });
    doc.page.margins.bottom = bottom;
  }
  doc.end();
  return done;
}
