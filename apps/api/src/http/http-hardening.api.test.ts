import express from 'express';
import fs from 'node:fs';
import net from 'node:net';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DiskBlobStore } from '../storage/blob-store';
import { singleFileUpload } from '../storage/upload';
import { createCustomer, createShop } from '../testing/factories';
import { createTestApp, signIn, TEST_ORIGIN, type TestApp } from '../testing/test-app';
import { errorHandler } from './error-handler';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { stripe: true });
});
afterAll(() => t.close());

describe('same-origin check', () => {
  it('compares the Origin with APP_ORIGIN and never trusts the Host header', async () => {
    const agent = await signIn(t.app, (await createShop(t)).owner.email);
    const body = { name: 'Host Garage', contactName: 'H', contactEmail: 'h@example.test' };
    // A page on evil.example that reaches the app under that host name (DNS rebinding, a proxy passing Host on).
    const spoofed = await agent.post('/api/dealers').set('Host', 'evil.example').set('Origin', 'http://evil.example').send(body);
    expect(spoofed.status).toBe(403);
    expect((await agent.post('/api/dealers').set('Origin', TEST_ORIGIN).send(body)).status).toBe(201);
  });
});

describe('Cache-Control on signed-in answers', () => {
  it('is no-store on signed-in JSON, so a shared cache or the back button never shows another person’s data', async () => {
    const agent = await signIn(t.app, (await createCustomer(t, await createShop(t))).email);
    for (const url of ['/api/me', '/api/jobs', '/api/notifications']) {
      const res = await agent.get(url);
      expect(res.status).toBe(200);
      expect(res.headers['cache-control']).toBe('no-store');
    }
  });
});

describe('payment-provider errors', () => {
  it('reach the user as a clear 502, not as "The request was not understood."', async () => {
    const owner = await signIn(t.app, (await createShop(t)).owner.email);
    expect((await owner.post('/api/billing/checkout').send({ purpose: 'payment_method' })).status).toBe(200);
    // The stand-in forgets everything, as after a restart: the shop's provider customer no longer exists there.
    t.stripe!.control.reset();
    const res = await owner.post('/api/billing/checkout').send({ purpose: 'payment_method' });
    expect(res.status).toBe(502);
    expect(res.body.error).toMatchObject({ code: 'payment_provider', message: expect.stringMatching(/^The payment provider did not accept the request: .+/) });
  });
});

describe('an upload the client aborts', () => {
  it('is logged at info, not as an unhandled error, and leaves no temp file', async () => {
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'revloop-abort-'));
    const store = new DiskBlobStore(dataDir);
    const logged: Array<[string, unknown]> = [];
    const log = { info: (...a: unknown[]) => logged.push(['info', a]), warn: (...a: unknown[]) => logged.push(['warn', a]), error: (...a: unknown[]) => logged.push(['error', a]) };
    const app = express();
    app.use((req, _res, next) => {
      (req as unknown as { log: typeof log }).log = log;
      next();
    });
    app.post('/upload', singleFileUpload(store, 'file', () => 10_000_000), (_req, res) => {
      res.status(201).end();
    });
    app.use(errorHandler);
    const server = app.listen(0, '127.0.0.1');
    await new Promise((resolve) => server.once('listening', resolve));
    const { port } = server.address() as AddressInfo;
    const socket = net.connect(port, '127.0.0.1');
    await new Promise((resolve) => socket.once('connect', resolve));
    const boundary = 'revloop-abort';
    socket.write(
      `POST /upload HTTP/1.1\r\nHost: 127.0.0.1\r\nContent-Type: multipart/form-data; boundary=${boundary}\r\nContent-Length: 1000000\r\n\r\n` +
        `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="stock.bin"\r\nContent-Type: application/octet-stream\r\n\r\n` +
        'x'.repeat(20_000),
    );
    await new Promise((resolve) => setTimeout(resolve, 200));
    socket.destroy();
    await expect.poll(() => logged.length, { timeout: 3000 }).toBeGreaterThan(0);
    await new Promise((resolve) => setTimeout(resolve, 100));
    expect(logged.map(([level]) => level)).toEqual(['info']);
    expect(fs.readdirSync(store.tempDir)).toEqual([]);
    server.close();
    fs.rmSync(dataDir, { recursive: true, force: true });
  });
});
