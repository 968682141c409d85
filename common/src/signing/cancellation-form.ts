// The notice-of-cancellation form given with a contract signed at the buyer's home, completed and in
// duplicate (16 CFR 429.1(b), published: "a completed form in duplicate, captioned either 'NOTICE OF RIGHT
// TO CANCEL' or 'NOTICE OF CANCELLATION'", in ten-point bold type).
//
// The paragraphs are the regulation's own statements, with its blanks filled in (seller's name and address,
// the date of the transaction and the last day). Source of the wording: 16 CFR 429.1(b), written from
// memory and checked against a state regulator's quotation of the federal notice (Wisconsin DFI,
// "Three-Day Right to Cancel — Federal Notice", secondary). Check it against the official eCFR before
// relying on it in a new state. One sentence of our own follows the regulation's, clearly apart: the online
// way to cancel.
import { WEEKDAY_NAMES, calendarWeekday, type IsoDate } from '../deadlines/calendar-date';

export const CANCELLATION_FORM_CAPTION = 'NOTICE OF CANCELLATION';
export const CANCELLATION_FORM_SOURCE = '16 CFR 429.1(b)';
export const CANCELLATION_FORM_MARKING =
  'This form is given under 16 CFR 429.1(b). Where anything on it differs from the regulation, the ' +
  'regulation governs, in the buyer’s favour.';
/** The buyer's act, signed and dated under it. */
export const CANCELLATION_FORM_CANCEL_LINE = 'I HEREBY CANCEL THIS TRANSACTION.';

export interface CancellationFormInput {
  buyerName: string;
  sellerName: string;
  /** One line: street, city, state, ZIP. */
  sellerAddress: string;
  /** The date of the transaction: the day the buyer signed. */
  transactionDate: IsoDate;
  lastDayToCancel: IsoDate;
}

export interface CancellationForm {
  caption: string;
  source: string;
  marking: string;
  fields: { label: string; value: string }[];
  paragraphs: string[];
  cancelLine: string;
  /** Blank lines the buyer fills in to cancel. */
  buyerFields: string[];
}

/** '2026-07-08' → 'Wednesday, 2026-07-08'. */
export function weekdayDate(date: IsoDate): string {
  return `${WEEKDAY_NAMES[calendarWeekday(date)]}, ${date}`;
}

export function cancellationForm(p: CancellationFormInput): CancellationForm {
  const last = weekdayDate(p.lastDayToCancel);
  return {
    caption: CANCELLATION_FORM_CAPTION,
    source: CANCELLATION_FORM_SOURCE,
    marking: CANCELLATION_FORM_MARKING,
    fields: [
      { label: 'Date of the transaction', value: weekdayDate(p.transactionDate) },
      { label: 'Buyer', value: p.buyerName },
      { label: 'Seller', value: p.sellerName },
      { label: 'Seller’s place of business', value: p.sellerAddress },
      { label: 'Cancel not later than', value: `midnight at the end of ${last}` },
    ],
    paragraphs: [
      'You may CANCEL this transaction, without any penalty or obligation, within THREE BUSINESS DAYS from ' +
        'the above date.',
      'If you cancel, any property traded in, any payments made by you under the contract or sale, and any ' +
        'negotiable instrument executed by you will be returned within TEN BUSINESS DAYS following receipt by ' +
        'the seller of your cancellation notice, and any security interest arising out of the transaction ' +
        'will be cancelled.',
      'If you cancel, you must make available to the seller at your residence, in substantially as good ' +
        'condition as when received, any goods delivered to you under this contract or sale, or you may, if ' +
        'you wish, comply with the instructions of the seller regarding the return shipment of the goods at ' +
        'the seller’s expense and risk.',
      'If you do make the goods available to the seller and the seller does not pick them up within 20 days ' +
        'of the date of your notice of cancellation, you may retain or dispose of the goods without any ' +
        'further obligation. If you fail to make the goods available to the seller, or if you agree to ' +
        'return the goods to the seller and fail to do so, then you remain liable for performance of all ' +
        'obligations under the contract.',
      'To cancel this transaction, mail or deliver a signed and dated copy of this cancellation notice, or ' +
        `any other written notice, or send a telegram, to ${p.sellerName}, at ${p.sellerAddress}, not later than midnight of ` +
        `${last}.`,
      // Ours, not the regulation's (it may add to the buyer's ways of cancelling, never take from them).
      'You may also cancel online with the link in the e-mail that sent you this contract. Saturdays count as ' +
        'business days; Sundays and federal holidays do not.',
    ],
    cancelLine: CANCELLATION_FORM_CANCEL_LINE,
    buyerFields: ['Date', 'Buyer’s signature'],
  };
}
