import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';
import { dueDigests } from './notices';
import { deliver } from './outbox';

/** How often the app looks for digests that are due; one a day per curator at most goes out. */
const CHECK_EVERY_MS = 10 * 60 * 1000;

/**
 * Checks for due daily digests now and then every ten minutes until the server shuts down.
 * The timer never keeps the process alive on its own.
 */
export function scheduleDigests(
	db: Kysely<Database>,
	options: { hourUtc: number; origin: string }
): () => void {
	const run = async () => {
		try {
			const mails = await db
				.transaction()
				.execute((trx) => dueDigests(trx, { now: new Date(), ...options }));
			await deliver(mails);
		} catch (e) {
			console.error('Daily digests failed; will try again:', e);
		}
	};
	void run();
	const timer = setInterval(() => void run(), CHECK_EVERY_MS);
	timer.unref();
	const stop = () => clearInterval(timer);
	process.once('sveltekit:shutdown', stop);
	return stop;
}
