import fc from 'fast-check';
import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import '../support/fast-check';
import type { Database } from '$lib/server/db/schema';
import { UPLOAD_COLUMNS, UPLOAD_KINDS } from '$lib/catalogue/uploadColumns';
import { checkUpload } from '$lib/server/uploads/checkUpload';
import { commitUpload } from '$lib/server/uploads/commitUpload';
import { CsvLimitError } from '$lib/catalogue/csvRecords';
import { uploadCsvLimits } from '$lib/server/uploads/readCsv';
import { loadDemoScenario } from '$seed/load';
import { createTempDatabase } from '../support/tempDb';

// Random, mostly malformed CSV: the check never throws, and a commit writes all rows or none.
let db: Kysely<Database>;
let remove: () => Promise<void>;
let userId = '';

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	await loadDemoScenario(db);
	({ id: userId } = await db
		.insertInto('User')
		.values({
			email: 'fuzz@lab.test',
			name: 'fuzz',
			role: 'contributor',
			emailVerified: null,
			image: null,
			passwordHash: null,
			disabledAt: null
		})
		.returning('id')
		.executeTakeFirstOrThrow());
});
afterAll(async () => remove());

const cellArb = fc.oneof(
	fc.string({ maxLength: 12 }),
	fc.constantFrom(
		'',
		'-250',
		'−0,3',
		'25 °C',
		'1e309',
		'NaN',
		'"',
		'""',
		'HL000010',
		'HL999999',
		'[4Fe-4S]2+/1+',
		'SHE',
		'mV',
		'V',
		'epr_titration',
		'fe4s4',
		'7.0',
		'\r',
		'\n',
		';',
		'\t',
		'\uFEFF'
	),
	fc.double().map(String),
	fc.integer().map(String)
);

const csvArb = fc
	.record({
		kind: fc.constantFrom(...UPLOAD_KINDS),
		delimiter: fc.constantFrom(',', ';', '\t'),
		headerPick: fc.array(fc.nat(), { maxLength: 14 }),
		junkHeaders: fc.array(fc.string({ maxLength: 8 }), { maxLength: 2 }),
		rows: fc.array(fc.array(cellArb, { maxLength: 16 }), { maxLength: 12 }),
		eol: fc.constantFrom('\n', '\r\n'),
		quoteAll: fc.boolean()
	})
	.map((r) => {
		const names = UPLOAD_COLUMNS[r.kind].map((c) => c.name);
		const headers = [
			...r.headerPick.map((i) => names[i % names.length] as string),
			...r.junkHeaders
		];
		const q = (c: string) => (r.quoteAll ? `"${c.replace(/"/g, '""')}"` : c);
		const text = [headers, ...r.rows].map((row) => row.map(q).join(r.delimiter)).join(r.eol);
		return { kind: r.kind, text };
	});

const counts = async () =>
	Number(
		(
			await db
				.selectFrom('entry_version')
				.select((eb) => eb.fn.countAll().as('n'))
				.executeTakeFirstOrThrow()
		).n
	);

describe('random CSV files', () => {
	it('are checked without an exception, and committed whole or not at all', async () => {
		await fc.assert(
			fc.asyncProperty(csvArb, async ({ kind, text }) => {
				let check;
				try {
					check = await checkUpload(db, text, kind, {
						viewer: null,
						limits: { ...uploadCsvLimits, maxRows: 50 }
					});
				} catch (e) {
					if (e instanceof CsvLimitError) return;
					throw e;
				}
				expect(check.errorCount).toBe(check.issues.filter((i) => i.severity === 'error').length);
				for (const i of check.issues) expect(i.row).toBeGreaterThanOrEqual(1);
				const before = await counts();
				const user = {
					id: userId,
					email: 'fuzz@lab.test',
					name: 'fuzz',
					role: 'contributor' as const,
					groupIds: []
				};
				const result = await db
					.transaction()
					.execute((trx) =>
						commitUpload(trx, user, check, {
							filename: 'fuzz.csv',
							visibility: { visibility: 'public', groupId: null, embargoUntil: null },
							changeNote: null,
							origin: 'http://x.test',
							pendingRowsMax: 1_000_000
						})
					)
					.catch(() => null);
				const after = await counts();
				if (result === null) expect(after).toBe(before);
				else expect(after - before).toBe(check.entries.length + check.proteins.length);
			}),
			{ numRuns: 300 }
		);
	});
});
