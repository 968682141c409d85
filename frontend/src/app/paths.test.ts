import { describe, expect, it } from 'vitest';
import { paths, safeReturnPath } from './paths';

describe('paths', () => {
  it('builds links from the same patterns the router uses', () => {
    expect(paths.editBranch.href('abc-123')).toBe('/admin/branches/abc-123/edit');
    expect(paths.signIn.href({ returnTo: '/admin/users?x=1', reason: 'session-ended' })).toBe(
      '/sign-in?returnTo=%2Fadmin%2Fusers%3Fx%3D1&reason=session-ended',
    );
    expect(paths.signIn.href()).toBe('/sign-in');
    expect(paths.setPassword.href('a b')).toBe('/set-password?token=a%20b');
  });

  it.each([
    ['/admin/users', '/admin/users'],
    ['//evil.example/x', '/'],
    ['https://evil.example', '/'],
    ['/\\evil.example', '/'],
    ['/sign-in?returnTo=/x', '/'],
    [null, '/'],
  ])('follows the return path %s only inside the app', (input, expected) => {
    expect(safeReturnPath(input)).toBe(expected);
  });
});
