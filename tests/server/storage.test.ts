import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startFakeS3, type FakeS3 } from '../../fake-s3/start-fake-s3.ts';
import { parseEnv } from '@server/env.ts';
import { createS3Storage } from '@server/storage/s3-storage.ts';
import { freePort } from '../support/free-port.ts';

const dir = mkdtempSync(path.join(os.tmpdir(), 'bifolio-s3-'));
let fake: FakeS3;
let storage: ReturnType<typeof createS3Storage>;

beforeAll(async () => {
  fake = await startFakeS3({ port: await freePort(), directory: dir, bucket: 'figures-test' });
  storage = createS3Storage(parseEnv({ S3_ENDPOINT: fake.endpoint, S3_BUCKET: 'figures-test' }));
});
afterAll(async () => {
  storage?.client.destroy();
  await fake?.close();
  rmSync(dir, { recursive: true, force: true });
});

describe('S3 file storage against the local fake', () => {
  it('stores and returns binary objects byte for byte', async () => {
    const bytes = randomBytes(200_000);
    await storage.put('figures/a.png', bytes, 'image/png');
    const back = await storage.get('figures/a.png');
    expect(back?.equals(bytes)).toBe(true);
  });

  it('hands out a signed URL that reads the object directly', async () => {
    await storage.put('figures/b.svg', '<svg xmlns="http://www.w3.org/2000/svg"/>', 'image/svg+xml');
    const url = await storage.signedUrl('figures/b.svg', 60);
    const res = await fetch(url);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('image/svg+xml');
    expect(await res.text()).toBe('<svg xmlns="http://www.w3.org/2000/svg"/>');
  });

  it('answers null for a missing key and forgets deleted ones', async () => {
    expect(await storage.get('figures/none.png')).toBeNull();
    await storage.put('figures/c.txt', 'x', 'text/plain');
    await storage.delete('figures/c.txt');
    expect(await storage.get('figures/c.txt')).toBeNull();
  });

  it('checks the bucket can be reached', async () => {
    await expect(storage.check()).resolves.toBeUndefined();
    const missing = createS3Storage(parseEnv({ S3_ENDPOINT: fake.endpoint, S3_BUCKET: 'no-such-bucket' }));
    await expect(missing.check()).rejects.toBeTruthy();
    missing.client.destroy();
  });
});
