import { describe, expect, it } from 'vitest';
import { createLoopTurns } from '$lib/server/http/loopTurns';

/** A clock the test moves: each started request "works" for `costMs` of it. */
function fakeClock() {
	let t = 0;
	return { now: () => t, spend: (ms: number) => void (t += ms) };
}

/** Counts turns of the event loop: one increment per check phase, before the waiting requests. */
function turnCounter() {
	const counter = { turn: 0, stopped: false };
	const tick = () => {
		if (counter.stopped) return;
		counter.turn += 1;
		setImmediate(tick);
	};
	setImmediate(tick);
	return counter;
}

describe('bounded work per loop turn (http/loopTurns.ts)', () => {
	it('lets a request alone in its turn start synchronously', () => {
		const turns = createLoopTurns(4, fakeClock().now);
		expect(turns.admit()).toBeNull();
		expect(turns.waiting()).toBe(0);
	});

	it('spreads a burst over turns, about budgetMs of work each, in arrival order', async () => {
		const clock = fakeClock();
		const turns = createLoopTurns(4, clock.now);
		const counter = turnCounter();
		const startedIn: number[] = [];
		const order: number[] = [];
		const request = async (id: number) => {
			const wait = turns.admit();
			if (wait) await wait;
			order.push(id);
			startedIn.push(counter.turn);
			clock.spend(1);
		};
		// Twenty requests read in one poll of the loop, each 1 ms of work.
		const all = Array.from({ length: 20 }, (_, id) => request(id));
		expect(turns.waiting()).toBe(16);
		await Promise.all(all);
		counter.stopped = true;

		expect(order).toEqual(Array.from({ length: 20 }, (_, id) => id));
		const perTurn = new Map<number, number>();
		for (const turn of startedIn) perTurn.set(turn, (perTurn.get(turn) ?? 0) + 1);
		// 4 ms of budget and 1 ms a request: four start per turn, so the loop polls again
		// (and accepts a connection) after every four instead of after all twenty.
		expect([...perTurn.values()]).toEqual([4, 4, 4, 4, 4]);
		expect(turns.waiting()).toBe(0);
	});

	it('lets a request that needs more than the budget finish, then makes the next wait', async () => {
		const clock = fakeClock();
		const turns = createLoopTurns(4, clock.now);
		expect(turns.admit()).toBeNull();
		clock.spend(50);
		const next = turns.admit();
		expect(next).toBeInstanceOf(Promise);
		await next;
		expect(turns.waiting()).toBe(0);
	});

	it('refuses a budget that would stop every request', () => {
		expect(() => createLoopTurns(0)).toThrow(RangeError);
		expect(() => createLoopTurns(Number.NaN)).toThrow(RangeError);
	});
});
