/**
 * A job's number: the branch's code, "J", the year and month the contract was signed, and a sequence
 * within that branch and month — e.g. "MRW-J2607-004". Short enough to say on the phone, sortable
 * by month, and unique (the database's unique index backs it).
 */
export const JOB_SEQUENCE_DIGITS = 3;

/** The prefix shared by a branch's jobs of one month: "MRW-J2607-". */
export function jobNumberPrefix(branchCode: string, signedOn: string): string {
  const m = /^(\d{2})(\d{2})-(\d{2})-\d{2}$/.exec(signedOn);
  if (!m) throw new Error(`Not a date: ${signedOn}`);
  if (!/^[A-Z][A-Z0-9]{1,7}$/.test(branchCode)) throw new Error(`Not a branch code: ${branchCode}`);
  return `${branchCode}-J${m[2]}${m[3]}-`;
}

/** The number for the `sequence`-th job of the prefix (1-based); past 999 it simply grows a digit. */
export function formatJobNumber(branchCode: string, signedOn: string, sequence: number): string {
  if (!Number.isInteger(sequence) || sequence < 1) throw new Error(`Not a sequence: ${sequence}`);
  return `${jobNumberPrefix(branchCode, signedOn)}${String(sequence).padStart(JOB_SEQUENCE_DIGITS, '0')}`;
}

/** Reads a job number back into its parts, or null when it is not one. */
export function parseJobNumber(
  number: string,
): { branchCode: string; year: number; month: number; sequence: number } | null {
  const m = /^([A-Z][A-Z0-9]{1,7})-J(\d{2})(\d{2})-(\d{3,})$/.exec(number);
  if (!m) return null;
  const month = Number(m[3]);
  if (month < 1 || month > 12) return null;
  return { branchCode: m[1]!, year: 2000 + Number(m[2]), month, sequence: Number(m[4]) };
}
