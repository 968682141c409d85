import PDFDocument from 'pdfkit';
import {
  formatUsd,
  PRICE_BOOK_UNIT_LABELS,
  weekdayDate,
  type PriceBookUnit,
  type SigningOption,
} from '@loambook/common';
import type { PdfDocumentModel } from './document-model';
import { latoFonts, pdfText } from './fonts';

// US Letter, 0.75 in margins; the bottom margin leaves room for the footer.
const PAGE = { size: 'LETTER', margins: { top: 54, bottom: 72, left: 54, right: 54 } } as const;
const WIDTH = 612 - PAGE.margins.left - PAGE.margins.right;
const LEFT = PAGE.margins.left;
const INK = '#1a1a1a';
const MUTED = '#555555';
const RULE = '#999999';
const SHADE = '#f2f2f2';

const REGULAR = 'Lato';
const BOLD = 'Lato-Bold';

/** Draws a proposal or a signed contract; returns the PDF's bytes. Print-friendly: black on white, page numbers. */
export function renderPdf(model: PdfDocumentModel, opts: { compress?: boolean } = {}): Promise<Buffer> {
  const doc = new PDFDocument({
    size: PAGE.size,
    margins: PAGE.margins,
    bufferPages: true,
    compress: opts.compress ?? true,
    lang: 'en-US',
    displayTitle: true,
    info: {
      Title: model.title,
      Author: model.branch.name,
      Subject: `${model.reference} for ${model.homeowner.name}, ${model.property.addressLine1}`,
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
  new Writer(doc).document(model);
  doc.end();
  return done;
}

/** "5.00" → "5", "12.50" → "12.5". */
const shortDecimal = (v: string) => (v.includes('.') ? v.replace(/\.?0+$/, '') : v);

/** "240 lb", "12 points", "1 lump sum". */
function quantityWithUnit(quantity: string, unit: string): string {
  const label = PRICE_BOOK_UNIT_LABELS[unit as PriceBookUnit] ?? unit;
  const plural = shortDecimal(quantity) !== '1' && (unit === 'point' || unit === 'hour');
  return `${shortDecimal(quantity)} ${label}${plural ? 's' : ''}`;
}

class Writer {
  constructor(private readonly doc: PDFDocument) {}

  document(m: PdfDocumentModel): void {
    this.header(m);
    if (m.cancelledNote) this.banner(m.cancelledNote);
    if (m.draftNote) this.banner(m.draftNote);
    this.parties(m);
    this.findings(m);
    this.options(m);
    this.cautions(m);
    this.notices(m);
    if (m.kind === 'contract') this.signature(m);
    else this.cancellationPreview(m);
    if (m.cancellationForm) {
      this.cancellationForm(m, 1);
      this.cancellationForm(m, 2);
    }
    this.footers(m);
  }

  // ---- building blocks ------------------------------------------------------------------------

  private text(
    s: string,
    o: {
      size?: number;
      bold?: boolean;
      color?: string;
      gap?: number;
      width?: number;
      x?: number;
      align?: 'left' | 'right' | 'center';
    } = {},
  ) {
    const { doc } = this;
    doc.font(o.bold ? BOLD : REGULAR).fontSize(o.size ?? 10);
    const width = o.width ?? WIDTH - ((o.x ?? LEFT) - LEFT);
    this.room(doc.heightOfString(pdfText(s), { width }) + 2);
    // After a page break: the colour is part of the page's graphics state, so it is set again.
    doc.fillColor(o.color ?? INK);
    doc.text(pdfText(s), o.x ?? LEFT, doc.y, { width, lineGap: 1.5, align: o.align ?? 'left' });
    if (o.gap) doc.y += o.gap;
  }

  /** A new page when fewer than `h` points are left on this one. */
  private room(h: number): void {
    if (this.doc.y + h > this.doc.page.maxY()) {
      this.doc.addPage();
      this.doc.x = LEFT;
    }
  }

  /** A section heading, kept with at least `keep` points of what follows. */
  private heading(s: string, keep = 60): void {
    this.room(keep);
    this.doc.y += 10;
    this.text(s, { size: 13, bold: true, gap: 2 });
    this.rule();
  }

  private subheading(s: string): void {
    this.room(40);
    this.doc.y += 4;
    this.text(s, { size: 10.5, bold: true, gap: 1 });
  }

  private rule(color = RULE): void {
    const y = this.doc.y + 2;
    this.doc
      .save()
      .lineWidth(0.6)
      .strokeColor(color)
      .moveTo(LEFT, y)
      .lineTo(LEFT + WIDTH, y)
      .stroke()
      .restore();
    this.doc.y = y + 6;
  }

  private bullet(s: string, o: { size?: number; bold?: boolean } = {}): void {
    const { doc } = this;
    const size = o.size ?? 9.5;
    doc.font(o.bold ? BOLD : REGULAR).fontSize(size);
    const h = doc.heightOfString(pdfText(s), { width: WIDTH - 14 });
    this.room(h + 2);
    const y = doc.y;
    doc
      .fillColor(INK)
      .font(REGULAR)
      .text('•', LEFT + 2, y, { width: 10 });
    doc.font(o.bold ? BOLD : REGULAR).text(pdfText(s), LEFT + 14, y, { width: WIDTH - 14, lineGap: 1.5 });
    doc.y += 1.5;
  }

  /** A grey box with a bold label: cautions and banners. */
  private box(label: string, body: string, size = 9.5): void {
    const { doc } = this;
    const pad = 6;
    doc.font(REGULAR).fontSize(size);
    const bodyH = doc.heightOfString(pdfText(body), { width: WIDTH - 2 * pad, lineGap: 1.5 });
    doc.font(BOLD).fontSize(size);
    const labelH = label ? doc.heightOfString(pdfText(label), { width: WIDTH - 2 * pad }) + 2 : 0;
    const h = bodyH + labelH + 2 * pad;
    this.room(h + 6);
    const top = doc.y;
    doc.save().rect(LEFT, top, WIDTH, h).fillAndStroke(SHADE, RULE).restore();
    if (label)
      doc
        .font(BOLD)
        .fontSize(size)
        .fillColor(INK)
        .text(pdfText(label), LEFT + pad, top + pad, { width: WIDTH - 2 * pad });
    doc
      .font(REGULAR)
      .fontSize(size)
      .fillColor(INK)
      .text(pdfText(body), LEFT + pad, top + pad + labelH, {
        width: WIDTH - 2 * pad,
        lineGap: 1.5,
      });
    doc.y = top + h + 6;
  }

  private banner(s: string): void {
    this.box('', s, 10.5);
  }

  /** Label on the left, value on the right of the same line. */
  private pair(label: string, value: string, o: { bold?: boolean; labelWidth?: number } = {}): void {
    const { doc } = this;
    const labelWidth = o.labelWidth ?? 150;
    doc.font(o.bold ? BOLD : REGULAR).fontSize(10);
    const h = Math.max(
      doc.heightOfString(pdfText(label), { width: labelWidth }),
      doc.heightOfString(pdfText(value), { width: WIDTH - labelWidth - 8 }),
    );
    this.room(h + 2);
    const y = doc.y;
    doc.fillColor(MUTED).font(REGULAR).text(pdfText(label), LEFT, y, { width: labelWidth });
    doc
      .fillColor(INK)
      .font(o.bold ? BOLD : REGULAR)
      .text(pdfText(value), LEFT + labelWidth + 8, y, { width: WIDTH - labelWidth - 8 });
    doc.y = y + h + 2;
  }

  // ---- sections -------------------------------------------------------------------------------

  private header(m: PdfDocumentModel): void {
    const { doc } = this;
    const b = m.branch;
    const top = doc.y;
    doc
      .font(BOLD)
      .fontSize(16)
      .fillColor(INK)
      .text(pdfText(b.name), LEFT, top, { width: WIDTH * 0.6 });
    doc.font(REGULAR).fontSize(9.5).fillColor(MUTED);
    doc.text(pdfText(`${b.addressLine1}, ${b.city}, ${b.state} ${b.postalCode}`), { width: WIDTH * 0.6 });
    if (b.phone) doc.text(pdfText(`Phone ${b.phone}`), { width: WIDTH * 0.6 });
    const leftBottom = doc.y;
    const title = m.kind === 'contract' ? 'CONTRACT' : 'PROPOSAL';
    doc
      .font(BOLD)
      .fontSize(16)
      .fillColor(INK)
      .text(title, LEFT + WIDTH * 0.6, top, { width: WIDTH * 0.4, align: 'right' });
    doc.font(REGULAR).fontSize(9.5).fillColor(MUTED);
    doc.text(pdfText(m.reference), LEFT + WIDTH * 0.6, doc.y, { width: WIDTH * 0.4, align: 'right' });
    doc.text(pdfText(`Dated ${weekdayDate(m.datedOn)}`), LEFT + WIDTH * 0.6, doc.y, {
      width: WIDTH * 0.4,
      align: 'right',
    });
    doc.y = Math.max(leftBottom, doc.y) + 4;
    doc.x = LEFT;
    this.rule(INK);
  }

  private parties(m: PdfDocumentModel): void {
    this.heading(m.kind === 'contract' ? 'Buyer and property' : 'Homeowner and property');
    this.pair('Homeowner', m.homeowner.name, { bold: true });
    const contact = [m.homeowner.phone, m.homeowner.email].filter(Boolean).join(' · ');
    if (contact) this.pair('Contact', contact);
    const p = m.property;
    this.pair('Property', `${p.addressLine1}, ${p.city}, ${p.state} ${p.postalCode}`);
    if (m.salesperson) this.pair('Your representative', `${m.salesperson.name} · ${m.salesperson.email}`);
    this.pair(
      'Contractor',
      `${m.branch.name}, ${m.branch.addressLine1}, ${m.branch.city}, ${m.branch.state} ${m.branch.postalCode}`,
    );
  }

  private findings(m: PdfDocumentModel): void {
    this.heading('What the inspection found');
    const f = m.findings;
    if (!f) {
      this.text('No completed inspection is attached to this proposal.', { color: MUTED, gap: 4 });
      return;
    }
    if (f.inspectedOn) this.pair('Inspected on', weekdayDate(f.inspectedOn));
    if (f.summary) this.pair('Summary', f.summary);
    this.doc.y += 2;
    for (const item of f.items) {
      this.pair(item.label, item.lines.join('\n'), { labelWidth: 150 });
      if (item.caution) this.box('Caution', item.caution, 9);
    }
    if (f.survey) {
      const s = f.survey;
      this.subheading('Floor-elevation survey (screening)');
      this.pair('Readings', `${s.pointCount} points`);
      this.pair(
        'Largest difference',
        `${s.maxDifferentialIn} in, between ${s.highestLabel} (highest) and ${s.lowestLabel} (lowest)`,
      );
      this.pair(
        'Worst neighbouring pair',
        s.worstRatio
          ? `${s.worstRatio}: ${s.worstPair.differentialIn} in over ${s.worstPair.distanceFt} ft (${s.worstPair.a}–${s.worstPair.b})`
          : 'No difference in elevation between neighbouring points',
      );
      this.pair('Screening band', `${s.band.label}. Source: ${s.band.source}.`);
      this.box('A screening figure, not an engineering determination', s.caution, 9);
    }
    this.box('About these findings', f.caution, 9);
  }

  private options(m: PdfDocumentModel): void {
    this.heading(
      m.kind === 'contract' ? 'The work agreed' : m.options.length > 1 ? 'Your options' : 'The work proposed',
      180,
    );
    for (const o of m.options) this.option(o, m.kind === 'proposal' && m.options.length > 1);
  }

  private option(o: SigningOption, numbered: boolean): void {
    const { doc } = this;
    this.room(120);
    this.subheading(numbered ? `Option ${o.position}: ${o.title}` : o.title);
    if (o.description) this.text(o.description, { size: 9.5, color: MUTED, gap: 3 });

    // The lines: item, quantity, unit price, amount.
    const cols = [
      { title: 'Item', width: 262, align: 'left' as const },
      { title: 'Quantity', width: 80, align: 'right' as const },
      { title: 'Unit price', width: 76, align: 'right' as const },
      { title: 'Amount', width: 86, align: 'right' as const },
    ];
    const row = (cells: string[], bold = false) => {
      doc.font(bold ? BOLD : REGULAR).fontSize(9.5);
      const h = Math.max(
        ...cells.map((c, i) => doc.heightOfString(pdfText(c), { width: cols[i]!.width - 6 })),
      );
      this.room(h + 4);
      const y = doc.y;
      let x = LEFT;
      cells.forEach((c, i) => {
        doc.fillColor(INK).text(pdfText(c), x + 3, y, { width: cols[i]!.width - 6, align: cols[i]!.align });
        x += cols[i]!.width;
      });
      doc.y = y + h + 3;
    };
    row(
      cols.map((c) => c.title),
      true,
    );
    this.rule();
    for (const l of o.lines) {
      row([
        `${l.description} (${l.code})`,
        quantityWithUnit(l.quantity, l.unit),
        formatUsd(l.unitPrice),
        formatUsd(l.amount),
      ]);
    }
    this.rule();

    const total = (label: string, value: string, bold = false) => {
      doc.font(bold ? BOLD : REGULAR).fontSize(bold ? 11 : 10);
      const h = doc.heightOfString(pdfText(label), { width: 330 });
      this.room(h + 2);
      const y = doc.y;
      doc.fillColor(INK).text(pdfText(label), LEFT + WIDTH - 330 - 96, y, { width: 330, align: 'right' });
      doc.text(pdfText(value), LEFT + WIDTH - 90, y, { width: 87, align: 'right' });
      doc.y = y + h + 2;
    };
    total('List total', formatUsd(o.listTotal));
    if (o.discount.kind !== 'none') {
      const d = o.discount.kind === 'percent' ? `Discount (${shortDecimal(o.discount.value)}%)` : 'Discount';
      total(d, `−${formatUsd(o.discountTotal)}`);
    }
    total('Net price', formatUsd(o.netTotal));
    if (o.tax.treatment === 'invoice') total(o.tax.label, formatUsd(o.tax.chargedToHomeowner));
    else total(o.tax.label, formatUsd('0'));
    total('Total to pay', formatUsd(o.customerTotal), true);
    if (o.deposit) {
      total('Deposit', formatUsd(o.deposit.amount));
      this.text(
        'A deposit paid before the cancellation period ends is refunded in full if you cancel in time (FTC guidance: within 10 business days).',
        { size: 8.5, color: MUTED },
      );
      for (const c of o.deposit.clocks) {
        this.text(
          `The contractor’s duty, ${c.title.toLowerCase()}: counted from when ${c.startsWhen}. ${c.rule} (${c.source})`,
          {
            size: 8.5,
            color: MUTED,
          },
        );
      }
    }
    doc.y += 6;
  }

  private cautions(m: PdfDocumentModel): void {
    this.heading('Safety and structural cautions');
    for (const c of m.cautions) this.bullet(c.text);
  }

  private notices(m: PdfDocumentModel): void {
    this.heading(m.kind === 'contract' ? 'Notices of this contract' : 'Notices the contract will carry');
    for (const n of m.notices) {
      this.room(80);
      // Florida's lien-law disclosure must be in at least 12-point capitalised bold type (F.S. 713.015).
      const big = n.code === 'FL_713_015';
      this.text(big ? n.title.toUpperCase() : n.title, { size: big ? 12 : 10.5, bold: true });
      this.text(`Source: ${n.source}`, { size: 9, color: MUTED });
      if (n.text) this.text(n.text, { size: 10.5, bold: true, gap: 2 });
      if (n.wordingStatement) this.text(n.wordingStatement, { size: big ? 12 : 10, bold: big, gap: 2 });
      this.text(`Why it applies: ${n.appliesBecause}`, { size: 8.5, color: MUTED });
      if (n.acknowledgedAt)
        this.text(`Acknowledged by the buyer when signing, ${n.acknowledgedAt}.`, { size: 9 });
      else if (m.kind === 'proposal' && n.optionIds.length < m.options.length) {
        const which = m.options.filter((o) => n.optionIds.includes(o.id)).map((o) => o.position);
        this.text(`Applies to option${which.length > 1 ? 's' : ''} ${which.join(', ')}.`, {
          size: 8.5,
          color: MUTED,
        });
      }
      this.doc.y += 6;
    }
  }

  private cancellationPreview(m: PdfDocumentModel): void {
    const c = m.cancellation;
    this.heading('Your right to cancel');
    this.text('When you sign, your contract carries this statement next to your signature:', {
      size: 9.5,
      gap: 2,
    });
    this.text(c.statement, { size: 11, bold: true, gap: 4 });
    this.text(
      `Signed on ${weekdayDate(c.signedOn)}, the contract could be cancelled until midnight at the end of ` +
        `${c.lastDayWeekday}, ${c.lastDayToCancel} (${c.timezone} time). The day you sign is printed on your contract ` +
        'with its own last day to cancel, and two notice-of-cancellation forms come with it.',
      { size: 9.5, gap: 2 },
    );
    this.text(`Source: ${c.source}.`, { size: 8.5, color: MUTED });
  }

  private signature(m: PdfDocumentModel): void {
    const s = m.signature!;
    const c = m.cancellation;
    const { doc } = this;
    this.heading('Acceptance');
    this.room(250);
    this.text(
      `By signing, the buyer accepts the work and the price above. Date of this transaction: ${weekdayDate(c.signedOn)}.`,
      { size: 10, gap: 4 },
    );
    // 16 CFR 429.1(a): in immediate proximity to the buyer's signature, bold, at least 10 points.
    this.text(c.statement, { size: 11, bold: true, gap: 4 });
    const top = doc.y;
    doc.save().rect(LEFT, top, 260, 90).lineWidth(0.6).stroke(RULE).restore();
    doc.image(s.png, LEFT + 6, top + 6, { fit: [248, 78], align: 'center', valign: 'center' });
    doc.y = top + 94;
    this.text(`Signed by ${s.signerName}`, { size: 10, bold: true });
    this.text(`Signed at ${s.signedAtLocal} (UTC${s.utcOffset}, ${c.timezone}); ${s.signedAtUtc} UTC`, {
      size: 9,
    });
    this.text(
      s.inPerson
        ? "Signed in person, on the representative's device"
        : 'Signed online, through the link sent by e-mail',
      { size: 9 },
    );
    if (s.ip) this.text(`From address ${s.ip}`, { size: 9 });
    if (s.userAgent) this.text(`Device: ${s.userAgent}`, { size: 8, color: MUTED });
    doc.y += 4;
    this.box(
      'Last day to cancel',
      `You may cancel this contract until midnight at the end of ${c.lastDayWeekday}, ${c.lastDayToCancel} ` +
        `(${c.timezone} time): use one of the notice-of-cancellation forms on the following pages, or the link in the ` +
        `e-mail that sent you this contract. Source: ${c.source}.`,
      10,
    );
  }

  private cancellationForm(m: PdfDocumentModel, copy: 1 | 2): void {
    const f = m.cancellationForm!;
    const { doc } = this;
    doc.addPage();
    doc.x = LEFT;
    this.text(f.caption, { size: 16, bold: true, align: 'center' });
    this.text(
      copy === 1 ? 'Copy 1 of 2: keep this copy' : 'Copy 2 of 2: to cancel, sign, date and send this copy',
      {
        size: 9.5,
        color: MUTED,
        align: 'center',
        gap: 8,
      },
    );
    this.box('', f.marking, 9);
    for (const field of f.fields) this.pair(field.label, field.value, { bold: true, labelWidth: 170 });
    doc.y += 6;
    // 16 CFR 429.1(b): ten-point bold type.
    for (const p of f.paragraphs) this.text(p, { size: 10.5, bold: true, gap: 6 });
    doc.y += 8;
    this.text(f.cancelLine, { size: 12, bold: true, gap: 24 });
    for (const label of f.buyerFields) {
      this.room(40);
      const y = doc.y + 18;
      doc
        .save()
        .lineWidth(0.8)
        .strokeColor(INK)
        .moveTo(LEFT, y)
        .lineTo(LEFT + 300, y)
        .stroke()
        .restore();
      doc.y = y + 3;
      this.text(label, { size: 9, color: MUTED, gap: 10 });
    }
    this.text(`Source: ${f.source}.`, { size: 8.5, color: MUTED });
  }

  private footers(m: PdfDocumentModel): void {
    const { doc } = this;
    const range = doc.bufferedPageRange();
    for (let i = range.start; i < range.start + range.count; i++) {
      doc.switchToPage(i);
      const bottom = doc.page.margins.bottom;
      doc.page.margins.bottom = 0; // writing in the margin must not start a new page
      const y = doc.page.height - 48;
      doc.font(REGULAR).fontSize(8).fillColor(MUTED);
      doc.text(pdfText(`${m.branch.name} · ${m.reference} · ${m.homeowner.name}`), LEFT, y, {
        width: WIDTH * 0.7,
        lineBreak: false,
      });
      doc.text(`Page ${i - range.start + 1} of ${range.count}`, LEFT + WIDTH * 0.7, y, {
        width: WIDTH * 0.3,
        align: 'right',
        lineBreak: false,
      });
      doc.text('Prepared with Loambook', LEFT, y + 11, { width: WIDTH, lineBreak: false });
      doc.page.margins.bottom = bottom;
    }
  }
}
