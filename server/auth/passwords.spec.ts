import bcrypt from 'bcryptjs';
import { describe, expect, it } from 'vitest';
import { DEFAULT_HASH_COST, KEY_BYTES, PasswordHasher, SALT_BYTES } from './passwords';

const hasher = new PasswordHasher(10);

function parts(hash: string): { params: string; salt: Buffer; key: Buffer } {
  const [, name, params, salt, key] = hash.split('$');
  expect(name).toBe('scrypt');
  return { params: params!, salt: Buffer.from(salt!, 'base64'), key: Buffer.from(key!, 'base64') };
}

describe('PasswordHasher', () => {
  it('writes a self-describing scrypt hash: parameters, 16-byte salt, 32-byte key', async () => {
    const hash = await hasher.hash('larkspur-paradiddle');
    expect(hash).toMatch(/^\$scrypt\$ln=10,r=8,p=1\$[A-Za-z0-9+/]+\$[A-Za-z0-9+/]+$/);
    const { params, salt, key } = parts(hash);
    expect(params).toBe('ln=10,r=8,p=1');
    expect(salt).toHaveLength(SALT_BYTES);
    expect(key).toHaveLength(KEY_BYTES);
    expect(hash).not.toContain('larkspur-paradiddle');
  });

  it('uses N = 2^15 unless told otherwise', async () => {
    expect(DEFAULT_HASH_COST).toBe(15);
    expect(new PasswordHasher().cost).toBe(15);
  });

  it('verifies the right password and refuses a wrong one', async () => {
    const hash = await hasher.hash('flam-drag-ruff');
    expect(await hasher.verify('flam-drag-ruff', hash)).toBe(true);
    expect(await hasher.verify('flam-drag-ruf', hash)).toBe(false);
    expect(await hasher.verify('', hash)).toBe(false);
  });

  it('salts each hash, so one password gives different hashes', async () => {
    const [a, b] = await Promise.all([hasher.hash('same'), hasher.hash('same')]);
    expect(a).not.toBe(b);
  });

  it('reads the parameters from the stored hash, so older settings still verify', async () => {
    const stronger = await new PasswordHasher(11).hash('moeller-stroke');
    expect(stronger).toMatch(/^\$scrypt\$ln=11,/);
    expect(await hasher.verify('moeller-stroke', stronger)).toBe(true);
    expect(hasher.needsRehash(stronger)).toBe(true);
    expect(hasher.needsRehash(await hasher.hash('x'))).toBe(false);
  });

  it('still verifies bcrypt hashes from before, and asks for them to be replaced', async () => {
    const old = await bcrypt.hash('larkspur-teacher', 4);
    expect(await hasher.verify('larkspur-teacher', old)).toBe(true);
    expect(await hasher.verify('larkspur-student', old)).toBe(false);
    expect(hasher.needsRehash(old)).toBe(true);
  });

  it('refuses a hash it cannot read instead of calling it a wrong password', async () => {
    await expect(hasher.verify('x', 'plain-text')).rejects.toThrow(/unknown format/);
    await expect(hasher.verify('x', '$scrypt$ln=99,r=8,p=1$AAAA$AAAA')).rejects.toThrow(
      /unknown format/,
    );
    expect(() => hasher.needsRehash('$argon2id$v=19$…')).toThrow(/unknown format/);
  });

  it('hashes off the event loop: timers keep firing during a production-cost hash', async () => {
    let ticks = 0;
    const timer = setInterval(() => ticks++, 1);
    try {
      await new PasswordHasher(DEFAULT_HASH_COST).hash('not-on-the-main-thread');
    } finally {
      clearInterval(timer);
    }
    // A hash on the main thread would let no timer run until it finished.
    expect(ticks).toBeGreaterThanOrEqual(2);
  });
});
