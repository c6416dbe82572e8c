import { mkdirSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import S3rver from 's3rver';

/** The local S3 fake (s3rver) on 127.0.0.1 with `bucket` created and objects under `directory`. */
export interface FakeS3 {
  port: number;
  endpoint: string;
  close(): Promise<void>;
}

export async function startFakeS3(options: { port: number; directory: string; bucket: string }): Promise<FakeS3> {
  mkdirSync(options.directory, { recursive: true });
  const server = new S3rver({
    address: '127.0.0.1',
    port: options.port,
    silent: true,
    directory: options.directory,
    configureBuckets: [{ name: options.bucket, configs: [] }],
  });
  const address = (await server.run()) as AddressInfo;
  const port = address.port;
  return {
    port,
    endpoint: `http://127.0.0.1:${port}`,
    close: () => server.close(),
  };
}
