import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import S3rver from 's3rver';

/** A fake S3 server (s3rver) on 127.0.0.1, a free port, keeping its objects in a temporary folder. */
export async function startFakeS3(bucket: string): Promise<{
	endpoint: string;
	stop: () => Promise<void>;
}> {
	const directory = mkdtempSync(join(tmpdir(), 'hopline-s3-'));
	const server = new S3rver({
		address: '127.0.0.1',
		port: 0,
		silent: true,
		directory,
		configureBuckets: [{ name: bucket }]
	});
	const { port } = await server.run();
	return {
		endpoint: `http://127.0.0.1:${port}`,
		stop: async () => {
			await server.close();
			rmSync(directory, { recursive: true, force: true });
		}
	};
}
