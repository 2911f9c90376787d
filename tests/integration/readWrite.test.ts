import { sql, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase } from '$lib/server/db/connect';
import type { Database } from '$lib/server/db/schema';
import { bumpCatalogueRevision, readCatalogueRevision } from '$lib/server/db/revision';
import { createTempDatabase } from '../support/tempDb';

// The two-connection dialect (src/lib/server/db/dialect.ts): reads outside transactions never
// wait for a writer, and still see every committed write and nothing uncommitted.
let db: Kysely<Database>;
let remove: () => Promise<void>;
beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
});
afterAll(async () => remove());

/** A write transaction held open until the returned `release` is called. */
function heldTransaction(work: (trx: Kysely<Database>) => Promise<unknown>) {
	let release!: () => void;
	const gate = new Promise<void>((resolve) => (release = resolve));
	let written!: () => void;
	const hasWritten = new Promise<void>((resolve) => (written = resolve));
	const done = db.transaction().execute(async (trx) => {
		await work(trx);
		written();
		await gate;
	});
	return { hasWritten, release, done };
}

const turns = () => new Promise((resolve) => setTimeout(resolve, 20));

describe('reads beside a write transaction', () => {
	it('answer while the transaction is open, without its uncommitted changes', async () => {
		const before = await readCatalogueRevision(db);
		const events: string[] = [];
		const held = heldTransaction((trx) => bumpCatalogueRevision(trx));
		await held.hasWritten;
		const read = readCatalogueRevision(db).then((revision) => {
			events.push('read');
			return revision;
		});
		await turns();
		events.push('commit');
		held.release();
		await held.done;
		// The old single-connection driver made the read wait for the commit: [commit, read].
		expect(events).toEqual(['read', 'commit']);
		expect(await read).toBe(before);
		expect(await readCatalogueRevision(db)).toBe(before + 1);
	});

	it('see a write made just before, outside any transaction', async () => {
		const before = await readCatalogueRevision(db);
		await bumpCatalogueRevision(db);
		expect(await readCatalogueRevision(db)).toBe(before + 1);
	});

	it('inside a transaction see its own uncommitted writes', async () => {
		await db.transaction().execute(async (trx) => {
			const bumped = await bumpCatalogueRevision(trx);
			expect(await readCatalogueRevision(trx)).toBe(bumped);
		});
	});
});

describe('writes', () => {
	it('wait for the open transaction, in the order they came', async () => {
		const before = await readCatalogueRevision(db);
		const events: string[] = [];
		const held = heldTransaction(async (trx) => {
			await bumpCatalogueRevision(trx);
			events.push('held');
		});
		await held.hasWritten;
		const first = bumpCatalogueRevision(db).then(() => events.push('first'));
		const second = db
			.transaction()
			.execute((trx) => bumpCatalogueRevision(trx))
			.then(() => events.push('second'));
		await turns();
		events.push('release');
		held.release();
		await Promise.all([held.done, first, second]);
		expect(events).toEqual(['held', 'release', 'first', 'second']);
		expect(await readCatalogueRevision(db)).toBe(before + 3);
	});

	it('roll back whole on failure and free the writer for the next one', async () => {
		const before = await readCatalogueRevision(db);
		await expect(
			db.transaction().execute(async (trx) => {
				await bumpCatalogueRevision(trx);
				await sql`insert into no_such_table values (1)`.execute(trx);
			})
		).rejects.toThrow(/no such table/);
		expect(await readCatalogueRevision(db)).toBe(before);
		await bumpCatalogueRevision(db);
		expect(await readCatalogueRevision(db)).toBe(before + 1);
	});

	it('go to the writer when a statement that looks like a read writes', async () => {
		const before = await readCatalogueRevision(db);
		const { rows } = await sql<{ revision: number }>`
			with next as (select revision + 1 as r from catalogue_state where id = 1)
			update catalogue_state set revision = (select r from next) where id = 1
			returning revision`.execute(db);
		expect(rows).toEqual([{ revision: before + 1 }]);
	});

	it('keep savepoints of a controlled transaction', async () => {
		const before = await readCatalogueRevision(db);
		const trx = await db.startTransaction().execute();
		await bumpCatalogueRevision(trx);
		const sp = await trx.savepoint('inner').execute();
		await bumpCatalogueRevision(sp);
		await sp.rollbackToSavepoint('inner').execute();
		await trx.commit().execute();
		expect(await readCatalogueRevision(db)).toBe(before + 1);
	});
});

describe('an in-memory database', () => {
	it('has one connection for reads and writes', async () => {
		const memory = openDatabase(':memory:');
		try {
			await sql`create table t (n integer)`.execute(memory);
			await sql`insert into t values (1)`.execute(memory);
			const { rows } = await sql<{ n: number }>`select n from t`.execute(memory);
			expect(rows).toEqual([{ n: 1 }]);
		} finally {
			await memory.destroy();
		}
	});
});
