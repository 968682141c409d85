// The notice-of-cancellation form given with a contract signed at the buyer's home, completed and in
// duplicate (16 CFR 429.1(b), published: "a completed form in duplicate, captioned either 'NOTICE OF RIGHT
// TO CANCEL' or 'NOTICE OF CANCELLATION'", in ten-point bold type).
//
// We could not re-read the regulation's whole form here, so we do NOT print it as the regulation's words.
// The form is clearly marked: it carries the completed fields the regulation asks for (date of the
// transaction, the seller's name and address, the last day to cancel), a summary in our own words
// (memory, matched against quotations of 429.1(b): secondary), and the statement that the wording of
// 16 CFR 429.1(b) applies. Replace the summary with the regulation's exact text once it has been checked
// against the official eCFR.
import { WEEKDAY_NAMES, calendarWeekday, type IsoDate } from '../deadlines/calendar-date';

export const CANCELLATION_FORM_CAPTION = 'NOTICE OF CANCELLATION';
export const CANCELLATION_FORM_SOURCE = '16 CFR 429.1(b)';
export const CANCELLATION_FORM_MARKING =
  'This form is given under 16 CFR 429.1(b), whose wording applies to it. The paragraphs below summarise ' +
  'that wording in plain words; where they differ, the regulation governs, in the buyer’s favour.';
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
      'You may cancel this transaction, without any penalty or obligation, within three business days from the ' +
        `date above: until midnight at the end of ${last}. Saturdays count as business days; Sundays and ` +
        'federal holidays do not.',
      'If you cancel, any payments you made under the contract (the deposit included), any property traded in ' +
        'and any negotiable instrument you signed will be returned within ten business days after the seller ' +
        'receives your cancellation notice, and any security interest arising out of the transaction will be ' +
        'cancelled.',
      'If goods were delivered to you under the contract, make them available to the seller at your home in ' +
        'substantially as good condition as when you received them, or follow the seller’s instructions for ' +
        'returning them at the seller’s expense and risk. If the seller does not pick them up within 20 days of ' +
        'your notice, you may keep or dispose of them without further obligation.',
      `To cancel, mail or deliver a signed and dated copy of this notice, or any other written notice, to ` +
        `${p.sellerName} at ${p.sellerAddress}, not later than midnight at the end of ${last}. You may also ` +
        'cancel online with the link in the e-mail that sent you this contract.',
    ],
    cancelLine: CANCELLATION_FORM_CANCEL_LINE,
    buyerFields: ['Date', 'Buyer’s signature'],
  };
}
