import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type {
	CentreDto,
	DistanceDto,
	Page,
	PotentialDto,
	ProteinDto,
	SpinRecordDto
} from '$lib/catalogue/dto';
import { decodeCursor, type PageCursor } from '$lib/schemas/pagination';
import { normalisePotential, potentialInputSchema } from '$lib/schemas/potential';
import type { Database } from '$lib/server/db/schema';
import {
	addVersion,
	approveVersion,
	createEntry,
	setEntryVisibility
} from '$lib/server/catalogue/entries';
import type { ListOptions } from '$lib/server/catalogue/keyset';
import { listPotentials } from '$lib/server/catalogue/potentials';
import { listCentres } from '$lib/server/kinds/centre';
import { listDistances } from '$lib/server/kinds/distance';
import { listProteins } from '$lib/server/kinds/protein';
import { listSpinRecords } from '$lib/server/kinds/spinRecord';
import { CursorMismatchError } from '$lib/server/catalogue/errors';
import { createTempDatabase } from '../support/tempDb';

// Walking a list page by page while the catalogue changes between two pages: an entry approved
// that sorts before the walk's position, an entry hidden behind it, a protein renamed from behind
// it to ahead of it. The oracle is the list itself read whole before and after the walk: every
// row present in both with the same sort key must come exactly once, in order; a renamed row
// comes where it stood when each page was read. Offsets (the paging these cursors replaced)
// fail the same walk, which shows that the walk can fail.
//
// Each scenario builds its own small catalogue under an organism of its own in one database, and
// every list is filtered by that organism (the search index is one per process, so one database).

let db: Kysely<Database>;
let remove: () => Promise<void>;
let groupId: number;
beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	({ id: groupId } = await db
		.insertInto('research_group')
		.values({ slug: 'closed', name: 'Closed group' })
		.returning('id')
		.executeTakeFirstOrThrow());
});
afterAll(async () => remove());

interface Made {
	id: number;
	accession: string;
	data: Record<string, unknown>;
}

async function approve(
	trx: Kysely<Database>,
	kind: 'protein' | 'centre' | 'potential' | 'spin_record' | 'distance',
	data: Record<string, unknown>
): Promise<Made> {
	const entry = await createEntry(trx, { kind });
	await approveVersion(trx, await addVersion(trx, entry.id, data, { status: 'submitted' }));
	return { id: entry.id, accession: entry.accession, data };
}

const potentialData = (centre: string, em: number, ph: number | null) =>
	normalisePotential(
		potentialInputSchema.parse({
			centreAccession: centre,
			couple: 'ox/red',
			reportedValue: em,
			reportedUnit: 'mV',
			referenceElectrode: 'SHE',
			ph,
			method: 'computed'
		})
	) as unknown as Record<string, unknown>;

/**
 * One protein with two centres, two potentials per centre, a spin record per centre and a
 * distance between them. `n` spreads the values (with ties, and missing pH and temperature).
 */
async function addProtein(trx: Kysely<Database>, organism: string, name: string, n: number) {
	const protein = await approve(trx, 'protein', { name, organism });
	const centres = [];
	for (const label of ['C1', 'C2']) {
		const centre = await approve(trx, 'centre', {
			proteinAccession: protein.accession,
			label: `${label}-${name}`,
			cofactorKind: 'other'
		});
		centres.push(centre);
		for (const k of [0, 1])
			await approve(
				trx,
				'potential',
				potentialData(centre.accession, -300 + ((n * 37 + k * 11) % 9) * 25, n % 3 ? 7 + k : null)
			);
		await approve(trx, 'spin_record', {
			centreAccession: centre.accession,
			oxidationLevel: 'red',
			spinS: (n % 4) / 2,
			temperatureK: n % 3 === 1 ? null : 5 + (n % 5),
			method: 'cw_epr_x'
		});
	}
	await approve(trx, 'distance', {
		centreAAccession: centres[0]!.accession,
		centreBAccession: centres[1]!.accession,
		edgeToEdgeA: 5 + (n % 4),
		structureId: `S${n}`,
		method: 'crystal_structure'
	});
	return protein;
}

/** A catalogue of eight proteins, added out of name order so accession and name orders differ. */
async function buildCatalogue(organism: string) {
	return db.transaction().execute(async (trx) => {
		const proteins: Made[] = [];
		for (const n of [5, 2, 7, 0, 3, 6, 1, 4])
			proteins.push(await addProtein(trx, organism, `Protein ${String.fromCharCode(66 + n)}`, n));
		return proteins;
	});
}

interface Row {
	accession: string;
	/** What the list sorts by, as text, to tell a renamed row from an unchanged one. */
	key: string;
}

interface ListUnderTest {
	name: string;
	sorts: { sort: string; order: 'asc' | 'desc' }[];
	read: (organism: string, options: ListOptions<string>) => Promise<Page<Row>>;
}

const asRows =
	<T extends { accession: string }>(key: (item: T) => string) =>
	(page: Page<T>): Page<Row> => ({
		...page,
		items: page.items.map((item) => ({ accession: item.accession, key: key(item) }))
	});

const LISTS: ListUnderTest[] = [
	{
		name: 'potentials',
		sorts: [
			{ sort: 'em', order: 'desc' },
			{ sort: 'ph', order: 'asc' },
			{ sort: 'protein', order: 'asc' }
		],
		read: async (organism, o) =>
			asRows((p: PotentialDto) => `${p.protein.name}|${p.emMvShe}|${p.ph}`)(
				await listPotentials(db, { organism: [organism] }, o as ListOptions<'em'>, null)
			)
	},
	{
		name: 'proteins',
		sorts: [
			{ sort: 'name', order: 'asc' },
			{ sort: 'name', order: 'desc' },
			{ sort: 'accession', order: 'desc' }
		],
		read: async (organism, o) =>
			asRows((p: ProteinDto) => p.name)(
				await listProteins(db, { organism: [organism] }, o as ListOptions<'name'>, null)
			)
	},
	{
		name: 'centres',
		sorts: [
			{ sort: 'protein', order: 'desc' },
			{ sort: 'label', order: 'asc' }
		],
		read: async (organism, o) =>
			asRows((c: CentreDto) => `${c.protein.name}|${c.label}`)(
				await listCentres(db, { organism: [organism] }, o as ListOptions<'label'>, null)
			)
	},
	{
		name: 'spin records',
		sorts: [
			{ sort: 'temperature', order: 'desc' },
			{ sort: 'temperature', order: 'asc' },
			{ sort: 'spin', order: 'asc' }
		],
		read: async (organism, o) =>
			asRows((r: SpinRecordDto) => `${r.temperatureK}|${r.spinS}`)(
				await listSpinRecords(db, { organism: [organism] }, o as ListOptions<'temperature'>, null)
			)
	},
	{
		name: 'distances',
		sorts: [
			{ sort: 'edge', order: 'desc' },
			{ sort: 'centre', order: 'asc' }
		],
		read: async (organism, o) =>
			asRows((d: DistanceDto) => `${d.edgeToEdgeAngstrom}|${d.centreA.label}`)(
				await listDistances(db, { organism: [organism] }, o as ListOptions<'edge'>, null)
			)
	}
];

/**
 * Between the second and third pages: two new proteins (with their rows) whose values sort first
 * in the given order, the walk's first row hidden (made group-only), and the protein of the
 * second page's last row renamed so that it sorts after every other.
 */
async function changeCatalogue(
	organism: string,
	order: 'asc' | 'desc',
	proteins: Made[],
	seenFirst: string,
	seenLast: string
) {
	await db.transaction().execute(async (trx) => {
		const proteinOf = async (accession: string) => {
			const row = await trx
				.selectFrom('entry as e')
				.leftJoin('centre as c', 'c.entry_id', 'e.id')
				.leftJoin('potential as p', 'p.entry_id', 'e.id')
				.leftJoin('spin_record as s', 's.entry_id', 'e.id')
				.leftJoin('distance as d', 'd.entry_id', 'e.id')
				.leftJoin('centre as sc', (j) =>
					j.on((eb) =>
						eb.or([
							eb('sc.entry_id', '=', eb.ref('s.centre_entry_id')),
							eb('sc.entry_id', '=', eb.ref('d.centre_a_entry_id'))
						])
					)
				)
				.select((eb) =>
					eb.fn
						.coalesce('c.protein_entry_id', 'p.protein_entry_id', 'sc.protein_entry_id', 'e.id')
						.as('protein')
				)
				.where('e.accession', '=', accession)
				.executeTakeFirstOrThrow();
			return proteins.find((p) => p.id === row.protein)!;
		};
		const { id: hiddenId } = await trx
			.selectFrom('entry')
			.select('id')
			.where('accession', '=', seenFirst)
			.executeTakeFirstOrThrow();
		let renamed = await proteinOf(seenLast);
		if (renamed.id === hiddenId) renamed = proteins.find((p) => p.id !== hiddenId)!;
		const first = order === 'asc';
		for (const copy of ['1', '2']) {
			const protein = await approve(trx, 'protein', {
				name: first ? `AAA first ${copy}` : `zzz first ${copy}`,
				organism
			});
			const centres = [];
			for (const label of ['C1', 'C2']) {
				const centre = await approve(trx, 'centre', {
					proteinAccession: protein.accession,
					label: first ? `AAA ${copy} ${label}` : `zzz ${copy} ${label}`,
					cofactorKind: 'other'
				});
				centres.push(centre);
				await approve(trx, 'potential', potentialData(centre.accession, first ? -1900 : 1900, 1));
				await approve(trx, 'spin_record', {
					centreAccession: centre.accession,
					oxidationLevel: 'red',
					spinS: first ? 0 : 5,
					temperatureK: first ? 1 : 399,
					method: 'cw_epr_x'
				});
			}
			await approve(trx, 'distance', {
				centreAAccession: centres[0]!.accession,
				centreBAccession: centres[1]!.accession,
				edgeToEdgeA: first ? 0.5 : 99,
				structureId: 'NEW',
				method: 'crystal_structure'
			});
		}
		await setEntryVisibility(trx, hiddenId, { visibility: 'group', groupId, embargoUntil: null });
		await approveVersion(
			trx,
			await addVersion(
				trx,
				renamed.id,
				{ ...renamed.data, name: first ? 'zzz renamed' : 'AAA renamed' },
				{ status: 'submitted' }
			)
		);
	});
}

type Paging = 'cursor' | 'offset';

/** Walks the whole list, `limit` rows at a time, changing the catalogue after two pages. */
async function walk(
	list: ListUnderTest,
	organism: string,
	sorting: { sort: string; order: 'asc' | 'desc' },
	paging: Paging,
	proteins: Made[]
) {
	const limit = 3;
	const seen: Row[] = [];
	let cursor: PageCursor | undefined;
	let offset = 0;
	for (let pageNo = 0; pageNo < 100; pageNo++) {
		const page = await list.read(organism, {
			...sorting,
			limit,
			...(paging === 'cursor' ? { cursor } : { offset })
		});
		expect(page.offset, 'offset of the page').toBe(paging === 'offset' ? offset : page.offset);
		seen.push(...page.items);
		if (pageNo === 1)
			await changeCatalogue(
				organism,
				sorting.order,
				proteins,
				seen[0]!.accession,
				seen.at(-1)!.accession
			);
		if (paging === 'cursor') {
			if (page.nextCursor === null) break;
			cursor = decodeCursor(page.nextCursor) ?? undefined;
		} else {
			offset += limit;
			if (offset >= page.total) break;
		}
	}
	return seen;
}

/** The rows every walk must return exactly once: listed before and after with the same key. */
function steadyRows(before: Row[], after: Row[]): Set<string> {
	const keyAfter = new Map(after.map((r) => [r.accession, r.key]));
	return new Set(before.filter((r) => keyAfter.get(r.accession) === r.key).map((r) => r.accession));
}

let scenario = 0;
async function scenarioFor(list: ListUnderTest, sorting: { sort: string; order: 'asc' | 'desc' }) {
	const organism = `Organism ${++scenario} ${list.name} ${sorting.sort} ${sorting.order}`;
	const proteins = await buildCatalogue(organism);
	const whole = async () => (await list.read(organism, { ...sorting, limit: 1000 })).items;
	return { organism, proteins, whole };
}

describe('keyset paging while the catalogue changes', () => {
	for (const list of LISTS) {
		for (const sorting of list.sorts) {
			it(`${list.name} by ${sorting.sort} ${sorting.order}: every steady row exactly once, in order`, async () => {
				const { organism, proteins, whole } = await scenarioFor(list, sorting);
				const before = await whole();
				const seen = await walk(list, organism, sorting, 'cursor', proteins);
				const after = await whole();
				const steady = steadyRows(before, after);
				expect(steady.size).toBeGreaterThan(before.length / 2);
				const counts = new Map<string, number>();
				for (const r of seen) counts.set(r.accession, (counts.get(r.accession) ?? 0) + 1);
				for (const accession of steady) expect(counts.get(accession), accession).toBe(1);
				// Steady rows come in the order of the list as it is after the changes.
				const order = after.map((r) => r.accession).filter((a) => steady.has(a));
				expect(seen.map((r) => r.accession).filter((a) => steady.has(a))).toEqual(order);
				// A row is never returned twice under the same key; the renamed protein's rows may come
				// once under each name (before the change and after it), never more.
				const seenKeys = seen.map((r) => `${r.accession}|${r.key}`);
				expect(new Set(seenKeys).size).toBe(seenKeys.length);
				for (const [accession, n] of counts)
					if (!steady.has(accession)) expect(n, accession).toBeLessThanOrEqual(2);
			});
		}
	}

	it('offsets fail the same walk (rows skipped or repeated), which the cursors above pass', async () => {
		const cases: [string, { sort: string; order: 'asc' | 'desc' }][] = [
			['potentials', { sort: 'em', order: 'desc' }],
			['centres', { sort: 'label', order: 'asc' }],
			['spin records', { sort: 'temperature', order: 'desc' }],
			['distances', { sort: 'edge', order: 'desc' }]
		];
		for (const [name, sorting] of cases) {
			const list = LISTS.find((l) => l.name === name)!;
			const { organism, proteins, whole } = await scenarioFor(list, sorting);
			const before = await whole();
			const seen = await walk(list, organism, sorting, 'offset', proteins);
			const steady = steadyRows(before, await whole());
			const counts = new Map<string, number>();
			for (const r of seen) counts.set(r.accession, (counts.get(r.accession) ?? 0) + 1);
			expect(
				[...steady].some((a) => counts.get(a) !== 1),
				name
			).toBe(true);
		}
	});

	it('steps back with prevCursor to the same rows, and from the second page to a full first page', async () => {
		const list = LISTS.find((l) => l.name === 'spin records')!;
		const sorting = { sort: 'temperature', order: 'desc' as const };
		const { organism, whole } = await scenarioFor(list, sorting);
		const all = (await whole()).map((r) => r.accession);
		const pages: Page<Row>[] = [];
		let cursor: PageCursor | undefined;
		for (;;) {
			const page = await list.read(organism, { ...sorting, limit: 4, cursor });
			pages.push(page);
			if (!page.nextCursor) break;
			cursor = decodeCursor(page.nextCursor) ?? undefined;
		}
		expect(pages.flatMap((p) => p.items.map((r) => r.accession))).toEqual(all);
		for (let i = pages.length - 1; i > 0; i--) {
			const back = await list.read(organism, {
				...sorting,
				limit: 4,
				cursor: decodeCursor(pages[i]!.prevCursor ?? '') ?? undefined
			});
			expect(back.items).toEqual(pages[i - 1]!.items);
			expect(back.offset).toBe(pages[i - 1]!.offset);
		}
		expect(pages[0]!.prevCursor).toBeNull();
	});

	it('refuses a cursor of another list, sort or order with 400 on `cursor`', async () => {
		const organism = 'Organism refusals';
		await buildCatalogue(organism);
		const page = await listProteins(
			db,
			{ organism: [organism] },
			{ sort: 'name', order: 'asc', limit: 2 },
			null
		);
		const cursor = decodeCursor(page.nextCursor ?? '') ?? undefined;
		const attempts = [
			listProteins(
				db,
				{ organism: [organism] },
				{ sort: 'name', order: 'desc', limit: 2, cursor },
				null
			),
			listProteins(db, { organism: [organism] }, { sort: 'organism', limit: 2, cursor }, null),
			listCentres(db, { organism: [organism] }, { limit: 2, cursor }, null),
			listPotentials(db, { organism: [organism] }, { sort: 'protein', limit: 2, cursor }, null)
		];
		for (const attempt of attempts) {
			const error = await attempt.catch((e: unknown) => e);
			expect(error).toBeInstanceOf(CursorMismatchError);
			expect((error as CursorMismatchError).fields?.cursor?.[0]).toMatch(/cursor/);
		}
	});
});
