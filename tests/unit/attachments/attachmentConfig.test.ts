import { describe, expect, it } from 'vitest';
import { parseConfig } from '$lib/server/config';

// Oracle: the defaults and rules written in the issue and in config.ts.
describe('attachment configuration', () => {
	it('defaults to 10 MB, 40 MP and the local disk', () => {
		const c = parseConfig({});
		expect(c.ATTACHMENT_MAX_BYTES).toBe(10 * 1024 * 1024);
		expect(c.ATTACHMENT_MAX_PIXELS).toBe(40_000_000);
		expect(c.S3_BUCKET).toBeUndefined();
		expect(c.S3_PREFIX).toBe('attachments/');
	});

	it('takes the S3 settings', () => {
		const c = parseConfig({
			S3_BUCKET: 'hopline-files',
			S3_ENDPOINT: 'http://127.0.0.1:9000',
			S3_ACCESS_KEY_ID: 'key',
			S3_SECRET_ACCESS_KEY: 'secret',
			S3_FORCE_PATH_STYLE: 'true'
		});
		expect(c.S3_BUCKET).toBe('hopline-files');
		expect(c.S3_FORCE_PATH_STYLE).toBe(true);
	});

	it('refuses a key without its secret', () => {
		expect(() => parseConfig({ S3_BUCKET: 'hopline-files', S3_ACCESS_KEY_ID: 'key' })).toThrow(
			/S3_ACCESS_KEY_ID and S3_SECRET_ACCESS_KEY go together/
		);
	});

	it('refuses an endpoint without a bucket', () => {
		expect(() => parseConfig({ S3_ENDPOINT: 'http://127.0.0.1:9000' })).toThrow(
			/without S3_BUCKET/
		);
	});

	it('refuses a limit below 1 kB', () => {
		expect(() => parseConfig({ ATTACHMENT_MAX_BYTES: '10' })).toThrow(/ATTACHMENT_MAX_BYTES/);
	});

	it('cleans up orphans every 6 hours by default; 0 turns it off; more than a week is refused', () => {
		expect(parseConfig({}).ATTACHMENT_CLEANUP_INTERVAL_MINUTES).toBe(360);
		expect(
			parseConfig({ ATTACHMENT_CLEANUP_INTERVAL_MINUTES: '0' }).ATTACHMENT_CLEANUP_INTERVAL_MINUTES
		).toBe(0);
		expect(() => parseConfig({ ATTACHMENT_CLEANUP_INTERVAL_MINUTES: '20000' })).toThrow(
			/ATTACHMENT_CLEANUP_INTERVAL_MINUTES/
		);
	});
});
