/*
 * Bounded work per turn of the event loop, so that a crowd of readers cannot keep the server
 * from taking new connections.
 *
 * Why: since libuv 1.45 (Node 20 ships 1.46) a listening socket accepts one connection per poll
 * of the loop. Every request that arrived in that poll is handled before the loop polls again,
 * so under load a turn lasts as long as all of those requests together — with 150 readers and
 * half a millisecond each, 75 ms — and new connections wait in the kernel's accept queue, the
 * last of 200 opened at once for more than ten seconds (DEVELOPERS.md, "Fast reads").
 *
 * How: the first requests of a turn start at once; once `budgetMs` of the turn has passed, a
 * request waits for a later turn (in arrival order) instead, so every turn ends soon and the
 * loop polls again — accepting the next connection and reading the next requests. An idle
 * server adds nothing: a request alone in its turn starts synchronously.
 *
 * A turn is opened by the first request after the previous one closed and closed by a
 * `setImmediate` scheduled then, i.e. in the next check phase of the loop.
 */
export interface LoopTurns {
	/**
	 * `null` when the request may start now; otherwise a promise that resolves in a later turn,
	 * when it may. Call it once per request, before the request's own work.
	 */
	admit(): Promise<void> | null;
	/** Requests waiting for a later turn now (for benchmarks and tests). */
	waiting(): number;
}

export function createLoopTurns(
	budgetMs: number,
	now: () => number = () => performance.now()
): LoopTurns {
	if (!(budgetMs > 0)) throw new RangeError(`budgetMs must be > 0, not ${budgetMs}`);
	let turnStartedAt = -1;
	let waiting = 0;

	const closeTurn = () => {
		turnStartedAt = -1;
	};
	const openTurn = () => {
		turnStartedAt = now();
		setImmediate(closeTurn);
	};
	/** Opens a turn when none is open; true when the caller may start in this one. */
	const mayStart = () => {
		if (turnStartedAt < 0) {
			openTurn();
			return true;
		}
		return now() - turnStartedAt < budgetMs;
	};

	return {
		admit() {
			if (mayStart()) return null;
			waiting += 1;
			return new Promise<void>((resolve) => {
				// Each waiting request is its own immediate, so the microtasks of one started request
				// run to completion before the next is asked; one that still may not start moves to
				// the end of the next turn's queue, behind those that were already waiting.
				const tryStart = () => {
					if (!mayStart()) return void setImmediate(tryStart);
					waiting -= 1;
					resolve();
				};
				setImmediate(tryStart);
			});
		},
		waiting: () => waiting
	};
}
