import { safeReturnUrl } from './return-url';

describe('safeReturnUrl', () => {
  it('should keep a path inside the app', () => {
    expect(safeReturnUrl('/w/abc/chains?page=2')).toBe('/w/abc/chains?page=2');
  });

  it('should drop absolute and protocol-relative URLs', () => {
    expect(safeReturnUrl('https://elsewhere.example/')).toBeNull();
    expect(safeReturnUrl('//elsewhere.example/')).toBeNull();
    expect(safeReturnUrl('/\\elsewhere.example/')).toBeNull();
  });

  it('should not return to the sign-in page itself', () => {
    expect(safeReturnUrl('/sign-in?next=/x')).toBeNull();
  });

  it('should give null without a target', () => {
    expect(safeReturnUrl(undefined)).toBeNull();
  });
});
