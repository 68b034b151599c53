import { hashPassword, verifyPassword } from './password';

describe('password hashing', () => {
  it('should verify the right password and refuse a wrong one', async () => {
    const stored = await hashPassword('tuned-circuit-42');
    expect(await verifyPassword('tuned-circuit-42', stored)).toBe(true);
    expect(await verifyPassword('tuned-circuit-43', stored)).toBe(false);
  });

  it('should salt: the same password hashes differently each time', async () => {
    const [a, b] = await Promise.all([
      hashPassword('same-password'),
      hashPassword('same-password'),
    ]);
    expect(a).not.toBe(b);
    expect(a).toMatch(/^scrypt\$32768\$8\$1\$[A-Za-z0-9+/=]+\$[A-Za-z0-9+/=]+$/);
  });

  it('should refuse a stored value it does not recognise instead of throwing', async () => {
    expect(await verifyPassword('anything', 'plain-text')).toBe(false);
    expect(await verifyPassword('anything', 'scrypt$1$2$3')).toBe(false);
  });
});
