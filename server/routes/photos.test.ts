import fs from 'node:fs';
import path from 'node:path';

import { count, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { schema } from '@/db';
import { photoLimits } from '@/shared/measurements';
import { createTestApp, formWith, makeJobBody, makeShop, memberWithRole, type TestApp } from '@/tests/fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

async function shopWithJob(name = 'Photo shop') {
  const shop = await makeShop(t, 'repair', name);
  const job = await shop.founder.post('/api/jobs', makeJobBody());
  return { ...shop, jobId: job.body.job.id as string };
}

// File signatures: JPEG starts FF D8 FF, PNG with its 8-byte signature, WebP is RIFF....WEBP.
const bytes = (head: number[], size = 64) => {
  const out = new Uint8Array(size);
  out.set(head);
  return out;
};
const JPEG = bytes([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46]);
const PNG = bytes([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0x00, 0x00, 0x00, 0x0d]);
const WEBP = bytes([0x52, 0x49, 0x46, 0x46, 0x38, 0x00, 0x00, 0x00, 0x57, 0x45, 0x42, 0x50]);

/** Every file under the shop's upload folder (none until its first photo). */
function filesOf(shopId: string): string[] {
  const dir = path.join(t.uploadsDir, shopId);
  return fs.existsSync(dir) ? fs.readdirSync(dir) : [];
}
const photoRows = (jobId: string) => t.db.select({ n: count() }).from(schema.photos).where(eq(schema.photos.jobId, jobId)).get()?.n ?? 0;

describe('job photos', () => {
  it('stores JPEG, PNG and WebP under generated names, lists them and serves each file to the shop', async () => {
    const { shopId, jobId } = await shopWithJob();
    const tech = await memberWithRole(t, shopId, 'tech');
    const res = await tech.upload(
      `/api/jobs/${jobId}/photos`,
      formWith(
        [
          ['photos', 'lifter 3E.jpg', JPEG, 'image/jpeg'],
          ['photos', 'lobe.png', PNG, 'image/png'],
          ['photos', 'bearing.webp', WEBP, 'image/webp'],
        ],
        { caption: 'Cylinder 3 exhaust' },
      ),
    );
    expect(res.status).toBe(201);
    expect(res.body.photos).toHaveLength(3);
    expect(res.body.photos.map((p: { mimeType: string }) => p.mimeType)).toEqual(['image/jpeg', 'image/png', 'image/webp']);
    expect(res.body.photos[0]).toMatchObject({ jobId, originalName: 'lifter 3E.jpg', caption: 'Cylinder 3 exhaust', shareable: false, size: 64 });

    const stored = filesOf(shopId).sort();
    expect(stored).toHaveLength(3);
    for (const name of stored) expect(name).toMatch(/^[0-9a-f-]{36}\.(jpg|png|webp)$/);

    const list = await tech.get(`/api/jobs/${jobId}/photos`);
    expect(list.body.photos).toEqual(res.body.photos);
    const photo = list.body.photos[1];
    expect(photo.url).toBe(`/api/photos/${photo.id}/file`);
    const file = await tech.fetchRaw(photo.url);
    expect(file.status).toBe(200);
    expect(file.headers.get('content-type')).toBe('image/png');
    expect(file.headers.get('x-content-type-options')).toBe('nosniff');
    expect(new Uint8Array(await file.arrayBuffer())).toEqual(PNG);
  });

  it('goes by the content: PNG bytes named .jpg are kept as a PNG; text named .png is refused by name and nothing is kept', async () => {
    const { founder, shopId, jobId } = await shopWithJob();
    const renamed = await founder.upload(`/api/jobs/${jobId}/photos`, formWith([['photos', 'lobe.jpg', PNG, 'image/jpeg']]));
    expect(renamed.status).toBe(201);
    expect(renamed.body.photos[0]).toMatchObject({ mimeType: 'image/png', originalName: 'lobe.jpg' });
    expect(filesOf(shopId)).toEqual([expect.stringMatching(/\.png$/)]);

    const text = new TextEncoder().encode('#!/bin/sh\necho this is not a photo\n');
    const disguised = await founder.upload(
      `/api/jobs/${jobId}/photos`,
      formWith([
        ['photos', 'good.jpg', JPEG, 'image/jpeg'],
        ['photos', 'photo.png', text, 'image/png'],
      ]),
    );
    expect(disguised.status).toBe(400);
    expect(disguised.body.error.message).toMatch(/photo\.png is not a JPEG, PNG or WebP image/);
    expect(disguised.body.error.fields).toEqual({ 'photo.png': expect.stringMatching(/not a JPEG, PNG or WebP/) });
    // The good file in the same request was not kept either.
    expect(photoRows(jobId)).toBe(1);
    expect(filesOf(shopId)).toHaveLength(1);

    const gif = await founder.upload(`/api/jobs/${jobId}/photos`, formWith([['photos', 'lobe.gif', JPEG, 'image/gif']]));
    expect(gif.status).toBe(400);
    expect(gif.body.error.fields['lobe.gif']).toMatch(/JPEG, PNG or WebP/);
    expect(filesOf(shopId)).toHaveLength(1);
  });

  it('refuses a file over 10 MB and more than 6 files, leaving no file behind', async () => {
    const { founder, shopId, jobId } = await shopWithJob();
    const big = new Uint8Array(photoLimits.maxBytes + 1);
    big.set(JPEG.subarray(0, 10));
    const tooBig = await founder.upload(`/api/jobs/${jobId}/photos`, formWith([['photos', 'huge.jpg', big, 'image/jpeg']]));
    expect(tooBig.status).toBe(413);
    expect(tooBig.body.error.message).toMatch(/10 MB or less/);
    const seven = Array.from(
      { length: photoLimits.maxFiles + 1 },
      (_, i) => ['photos', `p${i}.jpg`, JPEG, 'image/jpeg'] as [string, string, Uint8Array<ArrayBuffer>, string],
    );
    const tooMany = await founder.upload(`/api/jobs/${jobId}/photos`, formWith(seven));
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.message).toBe('Send at most 6 photos at a time');
    const wrongField = await founder.upload(`/api/jobs/${jobId}/photos`, formWith([['file', 'p.jpg', JPEG, 'image/jpeg']]));
    expect(wrongField.status).toBe(400);
    const none = await founder.upload(`/api/jobs/${jobId}/photos`, formWith([], { caption: 'x' }));
    expect(none.status).toBe(400);
    // Multer removes partial files after the response; give it a moment.
    await new Promise((r) => setTimeout(r, 100));
    expect(photoRows(jobId)).toBe(0);
    expect(filesOf(shopId)).toEqual([]);
    // Six at once is fine.
    const six = await founder.upload(`/api/jobs/${jobId}/photos`, formWith(seven.slice(0, photoLimits.maxFiles)));
    expect(six.status).toBe(201);
    expect(filesOf(shopId)).toHaveLength(6);
  });

  it('edits the caption and sharing, and deletes the row and the file', async () => {
    const { founder, shopId, jobId } = await shopWithJob();
    const photo = (await founder.upload(`/api/jobs/${jobId}/photos`, formWith([['photos', 'a.jpg', JPEG, 'image/jpeg']]))).body.photos[0];
    const edited = await founder.patch(`/api/photos/${photo.id}`, { caption: 'Galled lobe', shareable: true });
    expect(edited.status).toBe(200);
    expect(edited.body.photo).toMatchObject({ id: photo.id, caption: 'Galled lobe', shareable: true });
    const bad = await founder.patch(`/api/photos/${photo.id}`, { caption: 'x'.repeat(201), size: 1 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({ caption: 'Keep the caption under 200 characters', size: 'Unknown field' });
    expect(filesOf(shopId)).toHaveLength(1);
    expect((await founder.delete(`/api/photos/${photo.id}`)).status).toBe(204);
    await new Promise((r) => setTimeout(r, 50));
    expect(filesOf(shopId)).toEqual([]);
    expect((await founder.fetchRaw(photo.url)).status).toBe(404);
    expect((await founder.get(`/api/jobs/${jobId}/photos`)).body.photos).toEqual([]);
  });

  it("keeps another shop, a customer and a grinder away from a shop's photos", async () => {
    const a = await shopWithJob('Shop A');
    const b = await shopWithJob('Shop B');
    const photo = (await a.founder.upload(`/api/jobs/${a.jobId}/photos`, formWith([['photos', 'a.jpg', JPEG, 'image/jpeg']]))).body.photos[0];
    const other = await b.founder.fetchRaw(photo.url);
    expect(other.status).toBe(404);
    expect(await other.text()).not.toContain('\u00ff\u00d8');
    expect((await b.founder.get(`/api/jobs/${a.jobId}/photos`)).status).toBe(404);
    expect((await b.founder.upload(`/api/jobs/${a.jobId}/photos`, formWith([['photos', 'b.jpg', JPEG, 'image/jpeg']]))).status).toBe(404);
    expect((await b.founder.patch(`/api/photos/${photo.id}`, { caption: 'mine' })).status).toBe(404);
    expect((await b.founder.delete(`/api/photos/${photo.id}`)).status).toBe(404);
    expect(filesOf(b.shopId)).toEqual([]);
    for (const role of ['customer', 'grinder'] as const) {
      const person = await memberWithRole(t, a.shopId, role);
      expect((await person.fetchRaw(photo.url)).status).toBe(404);
      expect((await person.get(`/api/jobs/${a.jobId}/photos`)).status).toBe(403);
      expect((await person.upload(`/api/jobs/${a.jobId}/photos`, formWith([['photos', 'c.jpg', JPEG, 'image/jpeg']]))).status).toBe(403);
      expect((await person.patch(`/api/photos/${photo.id}`, { caption: 'x' })).status).toBe(403);
      expect((await person.delete(`/api/photos/${photo.id}`)).status).toBe(403);
    }
    const anonymous = await fetch(t.url + photo.url);
    expect(anonymous.status).toBe(401);
    expect(filesOf(a.shopId)).toHaveLength(1);
    expect((await a.founder.fetchRaw(photo.url)).status).toBe(200);
  });
});
