/**
 * Password rule shared by the set-password screen and the server. Length is what matters most
 * (NIST SP 800-63B §5.1.1.2 asks for at least 8 and encourages longer; we ask for 12, a common-practice
 * choice for accounts that move money). No composition rules, per the same guidance.
 */
export const PASSWORD_MIN_LENGTH = 12;
export const PASSWORD_MAX_LENGTH = 200;

/** Returns a message a person can act on, or null when the password is acceptable. */
export function passwordProblem(password: string, context: { email?: string } = {}): string | null {
  if (password.length < PASSWORD_MIN_LENGTH) {
    return `Use at least ${PASSWORD_MIN_LENGTH} characters (a short sentence works well).`;
  }
  if (password.length > PASSWORD_MAX_LENGTH) {
    return `Use at most ${PASSWORD_MAX_LENGTH} characters.`;
  }
  if (password.trim().length === 0) {
    return 'A password cannot be only spaces.';
  }
  if (context.email && password.toLowerCase() === context.email.toLowerCase()) {
    return 'Your password cannot be your e-mail address.';
  }
  return null;
}
