import { crc32 } from 'node:zlib';
import { createCanvas, loadImage } from '@napi-rs/canvas';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../testing/test-app';
import { LOGO_MAX_HEIGHT, LOGO_MAX_WIDTH } from './logo-image';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

const TOMASZ = 'tomasz.reyes@larkspur.test';
const HANA = 'hana.lindqvist@larkspur.test';

/** A drawn logo: a coloured bar with a circle, as PNG or JPEG. */
function logo(width: number, height: number, mime: 'image/png' | 'image/jpeg'): Buffer {
  const canvas = createCanvas(width, height);
  const ctx = canvas.getContext('2d');
  ctx.fillStyle = '#1d5c8c';
  ctx.fillRect(0, height / 4, width, height / 2);
  ctx.beginPath();
  ctx.arc(width / 2, height / 2, height / 3, 0, 2 * Math.PI);
  ctx.fillStyle = '#e0a030';
  ctx.fill();
  return mime === 'image/png' ? canvas.toBuffer('image/png') : canvas.toBuffer('image/jpeg', 90);
}

/** Random pixels do not compress: a real PNG well over 1 MB. */
function noisyPng(width: number, height: number): Buffer {
  const canvas = createCanvas(width, height);
  const ctx = canvas.getContext('2d');
  const image = ctx.createImageData(width, height);
  let x = 2463534242;
  for (let i = 0; i < image.data.length; i++) {
    // xorshift32 (G. Marsaglia, "Xorshift RNGs", J. Stat. Software 8(14), 2003).
    x ^= x << 13;
    x ^= x >>> 17;
    x ^= x << 5;
    image.data[i] = i % 4 === 3 ? 255 : x & 0xff;
  }
  ctx.putImageData(image, 0, 0);
  return canvas.toBuffer('image/png');
}

const binary = (res: request.Response, done: (error: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (chunk: Buffer) => chunks.push(chunk));
  res.on('end', () => done(null, Buffer.concat(chunks)));
};

async function storedLogo(agent: request.Agent): Promise<Buffer | null> {
  const res = await agent.get('/api/branding/logo').buffer(true).parse(binary);
  return res.status === 200 ? (res.body as Buffer) : null;
}

describe('branding: studio name', () => {
  it('starts empty, keeps a trimmed name per teacher, and refuses a long one', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const hana = await t.signIn(HANA);
    expect((await tomasz.get('/api/branding')).body.branding).toMatchObject({
      studioName: '',
      logo: null,
    });
    const put = await tomasz.put('/api/branding').send({ studioName: '  Larkspur North Room ' });
    expect(put.status).toBe(200);
    expect(put.body.branding.studioName).toBe('Larkspur North Room');
    expect((await tomasz.get('/api/branding')).body.branding.studioName).toBe(
      'Larkspur North Room',
    );
    expect((await hana.get('/api/branding')).body.branding.studioName).toBe('');
    const long = await tomasz.put('/api/branding').send({ studioName: 'x'.repeat(121) });
    expect(long.status).toBe(400);
    expect(long.body.error.details[0].message).toBe('A studio name has at most 120 characters.');
    const extra = await tomasz.put('/api/branding').send({ studioName: 'a', colour: 'red' });
    expect(extra.status).toBe(400);
  });

  it('is for teachers only', async () => {
    expect((await t.agent().get('/api/branding')).status).toBe(401);
    const student = await t.signIn('student');
    expect((await student.get('/api/branding')).status).toBe(403);
    expect(
      (await student.put('/api/branding/logo').attach('logo', logo(40, 20, 'image/png'), 'l.png'))
        .status,
    ).toBe(403);
  });
});

describe('branding: logo upload', () => {
  it('stores a PNG scaled down to fit the print box, and serves it back', async () => {
    const hana = await t.signIn(HANA);
    const res = await hana
      .put('/api/branding/logo')
      .attach('logo', logo(1800, 400, 'image/png'), { filename: 'studio.png' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // 1800 × 400 scaled by 1/3 fits 600 × 280 (the width binds).
    expect(res.body.branding.logo).toEqual({ mime: 'image/png', width: 600, height: 133 });
    const stored = await storedLogo(hana);
    const image = await loadImage(stored!);
    expect([image.width, image.height]).toEqual([600, 133]);
    expect(image.width).toBeLessThanOrEqual(LOGO_MAX_WIDTH);
  });

  it('stores a JPEG as JPEG, whatever the file is called, and never enlarges a small one', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const res = await tomasz
      .put('/api/branding/logo')
      .attach('logo', logo(300, 120, 'image/jpeg'), { filename: 'logo.gif' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.branding.logo).toEqual({ mime: 'image/jpeg', width: 300, height: 120 });
    const stored = await storedLogo(tomasz);
    expect([...stored!.subarray(0, 3)]).toEqual([0xff, 0xd8, 0xff]);
    const tall = await tomasz
      .put('/api/branding/logo')
      .attach('logo', logo(200, 1000, 'image/jpeg'), 'tall.jpg');
    expect(tall.body.branding.logo).toEqual({
      mime: 'image/jpeg',
      width: 56,
      height: LOGO_MAX_HEIGHT,
    });
  });

  it('refuses a text file named .png, a 2 MB PNG and a cut-short PNG, and keeps the old logo', async () => {
    const hana = await t.signIn(HANA);
    await hana.put('/api/branding/logo').attach('logo', logo(400, 100, 'image/png'), 'ok.png');
    const before = await storedLogo(hana);
    expect(before).not.toBeNull();

    const png = logo(400, 160, 'image/png');
    const big = noisyPng(900, 800);
    expect(big.length).toBeGreaterThan(2_000_000);
    const cases: [string, Buffer, string, string, RegExp][] = [
      [
        'text named .png',
        Buffer.from('Not an image at all\n'),
        'logo.png',
        'invalid_logo',
        /PNG or JPEG/,
      ],
      ['2 MB PNG', big, 'big.png', 'logo_too_large', /at most 1 MB/],
      [
        'cut-short PNG',
        png.subarray(0, Math.floor(png.length * 0.6)),
        'cut.png',
        'invalid_logo',
        /cut short/,
      ],
      [
        'PNG without its end',
        png.subarray(0, png.length - 12),
        'cut.png',
        'invalid_logo',
        /cut short/,
      ],
      [
        'cut-short JPEG',
        logo(400, 160, 'image/jpeg').subarray(0, 900),
        'cut.jpg',
        'invalid_logo',
        /cut short/,
      ],
    ];
    for (const [name, bytes, filename, code, message] of cases) {
      const res = await hana
        .put('/api/branding/logo')
        .attach('logo', bytes, { filename, contentType: 'image/png' });
      expect(res.status, name).toBe(400);
      expect(res.body.error.code, name).toBe(code);
      expect(res.body.error.message, name).toMatch(message);
      expect(await storedLogo(hana), `${name}: nothing stored`).toEqual(before);
    }
    const none = await hana.put('/api/branding/logo').field('note', 'no file');
    expect(none.status).toBe(400);
    expect(none.body.error.code).toBe('logo_missing');
  });

  it('refuses a damaged chunk and an image declaring too many pixels, before decoding it', async () => {
    const hana = await t.signIn(HANA);
    const png = Buffer.from(logo(200, 80, 'image/png'));
    const damaged = Buffer.from(png);
    damaged[40] = damaged[40]! ^ 0xff;
    const res = await hana.put('/api/branding/logo').attach('logo', damaged, 'd.png');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/damaged/);
    // The same image declaring 10000 × 10000 pixels (its header's checksum made right again).
    const huge = Buffer.from(png);
    huge.writeUInt32BE(10_000, 16);
    huge.writeUInt32BE(10_000, 20);
    huge.writeUInt32BE(crc32(huge.subarray(12, 29)), 29);
    const bomb = await hana.put('/api/branding/logo').attach('logo', huge, 'h.png');
    expect(bomb.status).toBe(400);
    expect(bomb.body.error.message).toBe('A logo may be at most 6000 pixels on a side.');
  });

  it('removes the logo, and stays empty for a teacher without one', async () => {
    const tomasz = await t.signIn(TOMASZ);
    await tomasz.put('/api/branding/logo').attach('logo', logo(100, 50, 'image/png'), 'l.png');
    expect((await tomasz.delete('/api/branding/logo')).status).toBe(204);
    expect((await tomasz.get('/api/branding')).body.branding.logo).toBeNull();
    expect((await tomasz.get('/api/branding/logo')).status).toBe(404);
    // The name stays when the logo goes.
    expect((await tomasz.get('/api/branding')).body.branding.studioName).toBe(
      'Larkspur North Room',
    );
  });
});
