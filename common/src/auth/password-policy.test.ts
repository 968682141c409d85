import { describe, expect, it } from 'vitest';
import { PASSWORD_MIN_LENGTH, passwordProblem } from './password-policy';

describe('passwordProblem', () => {
  it.each([
    ['short', 'x'.repeat(PASSWORD_MIN_LENGTH - 1), /at least 12/],
    ['only spaces', ' '.repeat(14), /only spaces/],
    ['the e-mail', 'Pat@Example.com', /e-mail/],
  ])('refuses %s', (_name, password, message) => {
    expect(passwordProblem(password, { email: 'pat@example.com' })).toMatch(message);
  });

  it('accepts a 12-character passphrase', () => {
    expect(passwordProblem('clay soil ok')).toBeNull();
  });
});
