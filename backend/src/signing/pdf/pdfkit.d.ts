// pdfkit 0.17 ships no types (and @types/pdfkit is not installed): the part this feature uses.
declare module 'pdfkit' {
  import { Readable } from 'node:stream';

  interface PdfTextOptions {
    width?: number;
    height?: number;
    align?: 'left' | 'center' | 'right' | 'justify';
    lineGap?: number;
    paragraphGap?: number;
    indent?: number;
    continued?: boolean;
    lineBreak?: boolean;
    underline?: boolean;
    characterSpacing?: number;
  }

  interface PdfImageOptions {
    width?: number;
    height?: number;
    fit?: [number, number];
    align?: 'left' | 'center' | 'right';
    valign?: 'top' | 'center' | 'bottom';
  }

  interface PdfDocumentOptions {
    size?: string | [number, number];
    margins?: { top: number; bottom: number; left: number; right: number };
    bufferPages?: boolean;
    autoFirstPage?: boolean;
    compress?: boolean;
    pdfVersion?: string;
    lang?: string;
    displayTitle?: boolean;
    info?: {
      Title?: string;
      Author?: string;
      Subject?: string;
      Keywords?: string;
      Creator?: string;
      Producer?: string;
    };
  }

  interface PdfPage {
    width: number;
    height: number;
    margins: { top: number; bottom: number; left: number; right: number };
    maxY(): number;
  }

  class PDFDocument extends Readable {
    constructor(options?: PdfDocumentOptions);
    page: PdfPage;
    x: number;
    y: number;
    registerFont(name: string, src: Buffer | string): this;
    font(name: string, size?: number): this;
    fontSize(size: number): this;
    fillColor(color: string, opacity?: number): this;
    strokeColor(color: string, opacity?: number): this;
    lineWidth(width: number): this;
    text(text: string, options?: PdfTextOptions): this;
    text(text: string, x?: number, y?: number, options?: PdfTextOptions): this;
    heightOfString(text: string, options?: PdfTextOptions): number;
    widthOfString(text: string, options?: PdfTextOptions): number;
    currentLineHeight(includeGap?: boolean): number;
    moveDown(lines?: number): this;
    moveTo(x: number, y: number): this;
    lineTo(x: number, y: number): this;
    rect(x: number, y: number, w: number, h: number): this;
    stroke(color?: string): this;
    fill(color?: string): this;
    fillAndStroke(fill?: string, stroke?: string): this;
    image(src: Buffer | string, x?: number, y?: number, options?: PdfImageOptions): this;
    addPage(options?: PdfDocumentOptions): this;
    bufferedPageRange(): { start: number; count: number };
    switchToPage(n: number): this;
    save(): this;
    restore(): this;
    end(): void;
  }

  export = PDFDocument;
}
