import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';
import { removeOrphans } from './attachments';
import { attachmentStore } from './store';

/*
 * Orphan clean-up inside the app server: removeOrphans (attachments.ts) a minute after start,
 * then every ATTACHMENT_CLEANUP_INTERVAL_MINUTES, one run at a time, counts logged. The timers
 * never keep the process alive on their own. `npm run attachments:cleanup` does the same once,
 * for a deployment that prefers cron (interval 0).
 */

export interface CleanupCounts {
	attachments: number;
	files: number;
}

export interface CleanupScheduleOptions {
	intervalMinutes: number;
	/** One clean-up run (removeOrphans on the app's database and store). */
	run: () => Promise<CleanupCounts>;
	/** Where the store is, for the log line ('disk' or 's3'). */
	storeKind: string;
	/** @default 60 000 ms */
	firstRunAfterMs?: number;
	log?: (message: string) => void;
	logError?: (message: string, error: unknown) => void;
	/** Injected for tests; Node's own by default. */
	timers?: {
		setTimeout: (f: () => void, ms: number) => { unref?: () => unknown };
		setInterval: (f: () => void, ms: number) => { unref?: () => unknown };
		clear: (timer: unknown) => void;
	};
}

export interface CleanupSchedule {
	/**
	 * Runs a clean-up now unless one is running: its counts, or null when it was skipped or
	 * failed (the failure logged; the next run tries again).
	 */
	tick(): Promise<CleanupCounts | null>;
	stop(): void;
}

const nodeTimers: NonNullable<CleanupScheduleOptions['timers']> = {
	setTimeout: (f, ms) => setTimeout(f, ms),
	setInterval: (f, ms) => setInterval(f, ms),
	clear: (timer) => clearTimeout(timer as NodeJS.Timeout)
};

/** Starts the schedule; null when the interval is 0 (off). */
export function scheduleAttachmentCleanup(options: CleanupScheduleOptions): CleanupSchedule | null {
	if (options.intervalMinutes <= 0) return null;
	const timers = options.timers ?? nodeTimers;
	const log = options.log ?? ((m: string) => console.log(m));
	const logError = options.logError ?? ((m: string, e: unknown) => console.error(m, e));
	let running: Promise<CleanupCounts | null> | null = null;

	const tick = (): Promise<CleanupCounts | null> => {
		if (running) return Promise.resolve(null); // the one running is enough
		running = (async () => {
			try {
				const counts = await options.run();
				log(
					`Attachment clean-up: removed ${counts.attachments} orphaned attachment(s) and ${counts.files} file(s) from the ${options.storeKind} store.`
				);
				return counts;
			} catch (e) {
				logError('Attachment clean-up failed; the next run will try again:', e);
				return null;
			} finally {
				running = null;
			}
		})();
		return running;
	};

	const handles: unknown[] = [];
	const first = timers.setTimeout(() => void tick(), options.firstRunAfterMs ?? 60_000);
	first.unref?.();
	const every = timers.setInterval(() => void tick(), options.intervalMinutes * 60_000);
	every.unref?.();
	handles.push(first, every);
	const stop = () => handles.forEach((h) => timers.clear(h));
	return { tick, stop };
}

/** The app's schedule (hooks.server.ts init): its database and configured store; stops on shutdown. */
export function startAttachmentCleanup(db: Kysely<Database>, intervalMinutes: number): void {
	const store = attachmentStore();
	const schedule = scheduleAttachmentCleanup({
		intervalMinutes,
		storeKind: store.kind,
		run: () => removeOrphans(db, store)
	});
	if (schedule) process.once('sveltekit:shutdown', schedule.stop);
}
