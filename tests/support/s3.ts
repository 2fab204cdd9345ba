import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { FAKE_CREDENTIALS, startS3Fake } from '../../server/storage/fake.ts';
import { S3Storage, parseS3Url } from '../../server/storage/s3.ts';

export type S3Fake = {
  /** STORAGE_URL for an app server (credentials in `env`). */
  url: string;
  /** The environment a server process needs to use it. */
  env: Record<string, string>;
  /** A driver for this test process. */
  driver: (prefix?: string) => S3Storage;
  close: () => Promise<void>;
};

/**
 * The local S3 fake (s3rver) on a free port with a fresh temp directory and the bucket made. Smallest part size
 * (5 MiB) so a multipart upload is cheap to provoke.
 */
export async function startTestS3(bucket = 'tinctoria-test'): Promise<S3Fake> {
  const directory = await mkdtemp(path.join(tmpdir(), 'tinctoria-s3-'));
  const fake = await startS3Fake({ port: 0, directory, bucket });
  const url = `s3://${bucket}?endpoint=${encodeURIComponent(fake.endpoint)}&region=us-east-1&forcePathStyle=true&partSize=5242880`;
  return {
    url,
    env: {
      STORAGE_URL: url,
      AWS_ACCESS_KEY_ID: FAKE_CREDENTIALS.accessKeyId,
      AWS_SECRET_ACCESS_KEY: FAKE_CREDENTIALS.secretAccessKey,
    },
    driver: (prefix = '') =>
      new S3Storage({
        ...parseS3Url(prefix ? url.replace(`s3://${bucket}`, `s3://${bucket}/${prefix}`) : url),
        credentials: FAKE_CREDENTIALS,
      }),
    close: async () => {
      await fake.close();
      await rm(directory, { recursive: true, force: true });
    },
  };
}
