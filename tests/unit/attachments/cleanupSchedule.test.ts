import { describe, expect, it } from 'vitest';
import {
	scheduleAttachmentCleanup,
	type CleanupCounts,
	type CleanupScheduleOptions
} from '$lib/server/attachments/cleanupSchedule';

// The schedule's logic with its timers injected: which timers it asks for (and that they are
// unref'd), one run at a time, counts logged, failures logged and retried. No real time passes.

function fakeTimers() {
	const made: { kind: 'timeout' | 'interval'; ms: number; fire: () => void; unrefed: boolean }[] =
		[];
	const cleared: unknown[] = [];
	const timers: NonNullable<CleanupScheduleOptions['timers']> = {
		setTimeout: (fire, ms) => {
			const t = { kind: 'timeout' as const, ms, fire, unrefed: false };
			made.push(t);
			return { unref: () => (t.unrefed = true) };
		},
		setInterval: (fire, ms) => {
			const t = { kind: 'interval' as const, ms, fire, unrefed: false };
			made.push(t);
			return { unref: () => (t.unrefed = true) };
		},
		clear: (h) => cleared.push(h)
	};
	return { made, cleared, timers };
}

function deferred<T>() {
	let resolve!: (v: T) => void;
	let reject!: (e: unknown) => void;
	const promise = new Promise<T>((res, rej) => ((resolve = res), (reject = rej)));
	return { promise, resolve, reject };
}

describe('attachment clean-up schedule', () => {
	it('is off at 0 minutes: no timer at all', () => {
		const { made, timers } = fakeTimers();
		const schedule = scheduleAttachmentCleanup({
			intervalMinutes: 0,
			storeKind: 'disk',
			run: () => Promise.resolve({ attachments: 0, files: 0 }),
			timers
		});
		expect(schedule).toBeNull();
		expect(made).toEqual([]);
	});

	it('runs a minute after start, then every interval, on timers that keep nothing alive', () => {
		const { made, timers, cleared } = fakeTimers();
		const schedule = scheduleAttachmentCleanup({
			intervalMinutes: 360,
			storeKind: 'disk',
			run: () => Promise.resolve({ attachments: 0, files: 0 }),
			timers,
			log: () => {}
		});
		expect(made.map(({ kind, ms, unrefed }) => ({ kind, ms, unrefed }))).toEqual([
			{ kind: 'timeout', ms: 60_000, unrefed: true },
			{ kind: 'interval', ms: 360 * 60_000, unrefed: true }
		]);
		schedule?.stop();
		expect(cleared).toHaveLength(2);
	});

	it('one run at a time: a tick while a run is going does not start another', async () => {
		const { made, timers } = fakeTimers();
		const gate = deferred<CleanupCounts>();
		let runs = 0;
		const logs: string[] = [];
		const schedule = scheduleAttachmentCleanup({
			intervalMinutes: 1,
			storeKind: 's3',
			run: () => {
				runs++;
				return gate.promise;
			},
			timers,
			log: (m) => logs.push(m)
		});
		if (!schedule) throw new Error('expected a schedule');
		const first = schedule.tick();
		made.forEach((t) => t.fire()); // both timers fire while the first run is going
		expect(await schedule.tick()).toBeNull();
		expect(runs).toBe(1);
		gate.resolve({ attachments: 2, files: 5 });
		expect(await first).toEqual({ attachments: 2, files: 5 });
		expect(logs).toEqual([
			'Attachment clean-up: removed 2 orphaned attachment(s) and 5 file(s) from the s3 store.'
		]);
		// Once it has finished, the next tick runs again.
		expect(await schedule.tick()).toEqual({ attachments: 2, files: 5 });
		expect(runs).toBe(2);
	});

	it('a failed run is logged, and the next run goes ahead', async () => {
		const { timers } = fakeTimers();
		const errors: string[] = [];
		let call = 0;
		const schedule = scheduleAttachmentCleanup({
			intervalMinutes: 5,
			storeKind: 'disk',
			run: () =>
				++call === 1
					? Promise.reject(new Error('store unreachable'))
					: Promise.resolve({ attachments: 1, files: 1 }),
			timers,
			log: () => {},
			logError: (m, e) => errors.push(`${m} ${(e as Error).message}`)
		});
		if (!schedule) throw new Error('expected a schedule');
		expect(await schedule.tick()).toBeNull();
		expect(errors).toEqual([
			'Attachment clean-up failed; the next run will try again: store unreachable'
		]);
		expect(await schedule.tick()).toEqual({ attachments: 1, files: 1 });
	});
});
