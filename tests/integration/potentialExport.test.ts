import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PotentialDto } from '$lib/catalogue/dto';
import { normalisePotential, potentialInputSchema } from '$lib/schemas/potential';
import {
	addVersion,
	approveVersion,
	createEntry,
	setEntryVisibility
} from '$lib/server/catalogue/entries';
import { ExportBusyError, ExportTooLargeError } from '$lib/server/catalogue/errors';
import {
	exportPotentials,
	exportsRunning,
	type ExportLimits
} from '$lib/server/catalogue/potentialExport';
import { listPotentials } from '$lib/server/catalogue/potentials';
import type { Database } from '$lib/server/db/schema';
import { openReadSnapshot } from '$lib/server/db/snapshot';
import { loadDemoScenario } from '$seed/load';
import { createTempDatabase } from '../support/tempDb';

// The export's promise: the count sent up front is the number of rows that follow, and the rows
// are those the search matched when the export began — in its order — even when approvals and
// visibility changes land while it is being read. The oracle is listPotentials read whole
// before the changes.

let db: Kysely<Database>;
let path: string;
let remove: () => Promise<void>;
beforeAll(async () => {
	({ db, path, remove } = await createTempDatabase());
	await loadDemoScenario(db);
});
afterAll(async () => remove());

const limits: ExportLimits = { maxRows: 10_000, concurrency: 2, timeLimitMs: 30_000, chunkRows: 4 };
const snapshot = () => openReadSnapshot(path);

async function readAll(chunks: AsyncGenerator<PotentialDto[]>): Promise<PotentialDto[]> {
	const rows: PotentialDto[] = [];
	for await (const chunk of chunks) rows.push(...chunk);
	return rows;
}

describe('exporting every matching potential', () => {
	it('sends as many rows as it counted, from the catalogue as it was when it began', async () => {
		const sorting = { sort: 'em' as const, order: 'desc' as const };
		const expected = await listPotentials(db, {}, { ...sorting, limit: 500 }, null);
		const started = await exportPotentials(db, snapshot, {}, sorting, null, limits);
		expect(started.total).toBe(expected.total);
		const first = await started.chunks.next();
		expect(first.done).toBe(false);
		// Meanwhile: a new potential with the highest Em, and a listed one made group-only.
		const listed = expected.items[6]!;
		await db.transaction().execute(async (trx) => {
			const entry = await createEntry(trx, { kind: 'potential' });
			const data = normalisePotential(
				potentialInputSchema.parse({
					centreAccession: listed.centre.accession,
					couple: listed.couple,
					reportedValue: 1500,
					reportedUnit: 'mV',
					referenceElectrode: 'SHE',
					method: 'computed'
				})
			);
			await approveVersion(trx, await addVersion(trx, entry.id, data, { status: 'submitted' }));
			const { id: group } = await trx
				.insertInto('research_group')
				.values({ slug: 'export-test', name: 'Export test' })
				.returning('id')
				.executeTakeFirstOrThrow();
			const { id } = await trx
				.selectFrom('entry')
				.select('id')
				.where('accession', '=', listed.accession)
				.executeTakeFirstOrThrow();
			await setEntryVisibility(trx, id, {
				visibility: 'group',
				groupId: group,
				embargoUntil: null
			});
		});
		const rest = await readAll(started.chunks);
		const rows = [...(first.value ?? []), ...rest];
		expect(rows).toHaveLength(started.total);
		expect(rows.map((p) => p.accession)).toEqual(expected.items.map((p) => p.accession));
		// The next export sees the changes.
		const again = await exportPotentials(db, snapshot, {}, sorting, null, limits);
		const now = await readAll(again.chunks);
		expect(now).toHaveLength(again.total);
		expect(now[0]!.emMvShe).toBe(1500);
		expect(now.map((p) => p.accession)).not.toContain(listed.accession);
		expect(exportsRunning()).toBe(0);
	});

	it('refuses more rows than the limit before reading any', async () => {
		const { total } = await listPotentials(db, {}, { limit: 1 }, null);
		await expect(
			exportPotentials(db, snapshot, {}, {}, null, { ...limits, maxRows: total - 1 })
		).rejects.toBeInstanceOf(ExportTooLargeError);
		expect(exportsRunning()).toBe(0);
	});

	it('runs at most `concurrency` exports at once, and frees the place when one is cancelled', async () => {
		const one = { ...limits, concurrency: 1 };
		const first = await exportPotentials(db, snapshot, {}, {}, null, one);
		await expect(exportPotentials(db, snapshot, {}, {}, null, one)).rejects.toBeInstanceOf(
			ExportBusyError
		);
		await first.cancel();
		expect(exportsRunning()).toBe(0);
		const second = await exportPotentials(db, snapshot, { kind: ['fe4s4'] }, {}, null, one);
		const rows = await readAll(second.chunks);
		expect(rows.length).toBe(second.total);
		expect(rows.every((p) => p.centre.cofactorKind === 'fe4s4')).toBe(true);
	});

	it('cuts off an export still open after its time limit, even one nobody reads', async () => {
		const slow = await exportPotentials(db, snapshot, {}, {}, null, { ...limits, timeLimitMs: 50 });
		await new Promise((r) => setTimeout(r, 120));
		expect(slow.cutOff.aborted).toBe(true);
		expect(exportsRunning()).toBe(0);
		await expect(slow.chunks.next()).rejects.toThrow(/cut off/);
	});

	it('exports nothing but the header for words that match nothing', async () => {
		const none = await exportPotentials(db, snapshot, { q: 'zzyzx' }, {}, null, limits);
		expect(none.total).toBe(0);
		expect(await readAll(none.chunks)).toEqual([]);
		expect(exportsRunning()).toBe(0);
	});
});
