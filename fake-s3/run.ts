import path from 'node:path';
import { startFakeS3 } from './start-fake-s3.ts';

/** Runs the S3 fake alone: `tsx fake-s3/run.ts` (port and folder from S3_ENDPOINT and BIFOLIO_DATA_DIR). */
const endpoint = new URL(process.env.S3_ENDPOINT ?? 'http://127.0.0.1:4802');
const directory = path.resolve(process.env.BIFOLIO_DATA_DIR ?? './data', 's3');
const bucket = process.env.S3_BUCKET ?? 'bifolio';
const fake = await startFakeS3({ port: Number(endpoint.port), directory, bucket });
console.log(`S3 fake on ${fake.endpoint} (bucket "${bucket}", objects under ${directory}); Ctrl-C stops it.`);
for (const signal of ['SIGINT', 'SIGTERM'] as const) process.once(signal, () => void fake.close().then(() => process.exit(0)));
