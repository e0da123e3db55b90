import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fs from 'node:fs';
import { createTwoShops } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

// Kit photos: upload, list on the kit page, read, delete; images only; owners change them; tenancy answers 404.

let t: TestApp;
type Agent = Awaited<ReturnType<typeof signIn>>;
let owner: Agent, tuner: Agent, customer: Agent, otherOwner: Agent;
let kitId = '';

// The eight-byte PNG signature (PNG specification, section 5.2) followed by filler: enough for the type check.
const PNG = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.from('kit photo bytes')]);

beforeAll(async () => {
  t = await createTestApp();
  const { shop, people, other } = await createTwoShops(t);
  owner = await signIn(t.app, shop.owner.email);
  tuner = await signIn(t.app, people.tuner.email);
  customer = await signIn(t.app, people.customer.email);
  otherOwner = await signIn(t.app, other.owner.email);
  const kit = await owner.post('/api/kits').send({ name: 'Kit photo', interfaceSerial: 'IF-PH-1', weeklyPriceMinor: 9000, depositMinor: 30000, lateFeePerDayMinor: 1500 });
  kitId = kit.body.data.id;
});
afterAll(() => t.close());

const tempFiles = () => fs.readdirSync(t.blobs.tempDir).length;

describe('kit photos', () => {
  it('the owner uploads a photo; it is listed on the kit page and readable', async () => {
    const res = await owner.post(`/api/kits/${kitId}/photos`).attach('file', PNG, 'front.png');
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ contentType: 'image/png', originalName: 'front.png', sizeBytes: PNG.length });
    const page = await tuner.get(`/api/kits/${kitId}`);
    expect(page.body.data.photos).toEqual([expect.objectContaining({ id: res.body.data.id, url: res.body.data.url })]);
    const image = await tuner.get(res.body.data.url).buffer(true);
    expect(image.status).toBe(200);
    expect(image.headers['content-type']).toBe('image/png');
    expect(Buffer.compare(image.body as Buffer, PNG)).toBe(0);
  });

  it('refuses what is not an image, and others than the owner, leaving no file or row behind', async () => {
    const before = (await owner.get(`/api/kits/${kitId}`)).body.data.photos.length;
    const text = await owner.post(`/api/kits/${kitId}/photos`).attach('file', Buffer.from('not an image at all'), 'note.png');
    expect(text.status).toBe(400);
    expect(text.body.error.message).toContain('JPEG, PNG or WebP');
    expect((await tuner.post(`/api/kits/${kitId}/photos`).attach('file', PNG, 'x.png')).status).toBe(403);
    expect((await customer.post(`/api/kits/${kitId}/photos`).attach('file', PNG, 'x.png')).status).toBe(403);
    expect((await otherOwner.post(`/api/kits/${kitId}/photos`).attach('file', PNG, 'x.png')).status).toBe(404);
    expect((await owner.post(`/api/kits/${kitId}/photos`)).status).toBe(400);
    expect((await owner.get(`/api/kits/${kitId}`)).body.data.photos).toHaveLength(before);
    expect(tempFiles()).toBe(0);
  });

  it('the owner deletes a photo; another shop cannot read or delete it', async () => {
    const added = await owner.post(`/api/kits/${kitId}/photos`).attach('file', PNG, 'side.png');
    const { id, url } = added.body.data as { id: string; url: string };
    expect((await otherOwner.get(url)).status).toBe(404);
    expect((await otherOwner.delete(`/api/kits/${kitId}/photos/${id}`)).status).toBe(404);
    expect((await tuner.delete(`/api/kits/${kitId}/photos/${id}`)).status).toBe(403);
    expect((await owner.delete(`/api/kits/${kitId}/photos/${id}`)).status).toBe(204);
    expect((await owner.get(url)).status).toBe(404);
    expect((await owner.get(`/api/kits/${kitId}`)).body.data.photos.map((p: { id: string }) => p.id)).not.toContain(id);
  });
});
