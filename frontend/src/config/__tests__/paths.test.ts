import { describe, expect, it } from 'vitest';
import { safeNextPath, signInPath } from '../paths';

describe('safeNextPath()', () => {
  it('follows a path inside the app', () => {
    expect(safeNextPath('/admin/users?page=2')).toBe('/admin/users?page=2');
  });

  it('refuses addresses that would leave the site, and loops back to sign-in', () => {
    expect(safeNextPath('https://example.com/')).toBe('/');
    expect(safeNextPath('//example.com/x')).toBe('/');
    expect(safeNextPath('/\\example.com')).toBe('/');
    expect(safeNextPath('/sign-in?next=%2F')).toBe('/');
    expect(safeNextPath(null)).toBe('/');
  });

  it('builds the sign-in address with the page to return to', () => {
    expect(signInPath('/admin/organisations')).toBe('/sign-in?next=%2Fadmin%2Forganisations');
    expect(signInPath('/')).toBe('/sign-in');
  });
});
