import { mkdir } from 'node:fs/promises';

/** The access key and secret the s3rver fake accepts (its built-in account). */
export const FAKE_CREDENTIALS = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' };

/**
 * A local S3 fake (s3rver, objects as files under `directory`) on 127.0.0.1, with the bucket made: for development
 * (`npm start` with STORAGE_URL …&fake=1, server/storage/README.md) and the tests (tests/support/s3.ts). Port 0 picks a
 * free port. Not for production: no durability or access control beyond its one built-in key.
 */
export async function startS3Fake({ port, directory, bucket }: { port: number; directory: string; bucket: string }) {
  await mkdir(directory, { recursive: true });
  const { default: S3rver } = await import('s3rver');
  const fake = new S3rver({
    address: '127.0.0.1',
    port,
    silent: true,
    directory,
    configureBuckets: [{ name: bucket }],
  });
  const { port: actual } = await fake.run();
  return { port: actual, endpoint: `http://127.0.0.1:${actual}`, close: () => fake.close() };
}
