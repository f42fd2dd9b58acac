/** The local stand-in for S3: s3rver on loopback, data in a folder of ours, one bucket configured. */
import fs from 'node:fs';
import S3rver from 's3rver';

export interface S3Fake {
  port: number;
  endpoint: string;
  close: () => Promise<void>;
}

export async function startS3Fake(opts: { port: number; dir: string; bucket: string }): Promise<S3Fake> {
  fs.mkdirSync(opts.dir, { recursive: true });
  const server = new S3rver({
    port: opts.port,
    address: '127.0.0.1',
    directory: opts.dir,
    silent: true,
    configureBuckets: [{ name: opts.bucket, configs: [] }],
  });
  const addr = await server.run();
  const port = (addr as { port: number }).port;
  return { port, endpoint: `http://127.0.0.1:${port}`, close: () => server.close() };
}
