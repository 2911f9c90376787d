import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
	describeConflictRule,
	potentialConflict,
	type ListedPotential
} from '$lib/catalogue/conflicts';
import { parseEntryInput } from '$lib/schemas/submission';
import type { EntryData } from '$lib/schemas/entryData';
import { conflictFlags } from '$lib/server/catalogue/conflictFlags';
import { addVersion, approveVersion, createEntry } from '$lib/server/catalogue/entries';
import { warningsForVersion } from '$lib/server/curation/checks';
import type { Database } from '$lib/server/db/schema';
import { checkUpload } from '$lib/server/uploads/checkUpload';
import { uploadCsvLimits } from '$lib/server/uploads/readCsv';
import { loadDemoScenario } from '$seed/load';
import { createTempDatabase } from '../support/tempDb';

/**
 * One rule for every place that compares potentials (catalogue/conflicts.ts: k = 2 on
 * √(u₁² + u₂²), JCGM 100:2008 §6.2–6.3; values without a stated uncertainty not compared): the
 * warnings of a form or API submission, the CSV check (and what it stores), and the entry
 * pages' flags agree on the same values. The oracle is `potentialConflict` itself, applied by
 * hand to each pair.
 *
 * Values, at pH 9.9 where the demo centre has none: an approved −300 ± 20 mV, and proposed
 * −270 ± 20 (30 mV apart: flagged under the earlier k = 1 rule, not now), −200 ± 20 (100 mV,
 * beyond 2·28.3 = 56.6 mV) and −100 with no uncertainty (never compared).
 */
let db: Kysely<Database>;
let remove: () => Promise<void>;
let centre: string;
let base: string;
const COUPLE = '[4Fe-4S]2+/1+';
const PH = 9.9;

function potential(value: number, uncertaintyMv: number | null): EntryData {
	const r = parseEntryInput('potential', {
		centreAccession: centre,
		couple: COUPLE,
		reportedValue: value,
		reportedUnit: 'mV',
		referenceElectrode: 'SHE',
		ph: PH,
		temperatureK: 298.15,
		method: 'epr_titration',
		uncertaintyMv
	});
	if (!r.ok) throw new Error(JSON.stringify(r.fields));
	return r.entry;
}

async function approve(entry: EntryData): Promise<string> {
	return db.transaction().execute(async (trx) => {
		const made = await createEntry(trx, { kind: 'potential' });
		await approveVersion(trx, await addVersion(trx, made.id, entry.data, { status: 'submitted' }));
		return made.accession;
	});
}

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	await loadDemoScenario(db);
	const row = await db
		.selectFrom('potential')
		.select('centre_accession')
		.where('couple', '=', COUPLE)
		.orderBy('entry_id')
		.executeTakeFirstOrThrow();
	centre = row.centre_accession;
	const near = await db
		.selectFrom('potential')
		.select('accession')
		.where('centre_accession', '=', centre)
		.where('couple', '=', COUPLE)
		.where('ph', '>=', PH - 0.6)
		.execute();
	expect(near).toEqual([]);
	base = await approve(potential(-300, 20));
});
afterAll(async () => remove());

describe('the conflict rule, the same everywhere', () => {
	it('in the warnings of a form or API submission', async () => {
		const warn = (e: EntryData) =>
			warningsForVersion(db, e, { entryId: null, audience: 'curator' }).then((ws) =>
				ws.filter((w) => w.kind === 'conflict')
			);
		expect(await warn(potential(-270, 20))).toEqual([]);
		expect(await warn(potential(-100, null))).toEqual([]);
		expect(await warn(potential(-200, 20))).toEqual([
			{
				kind: 'conflict',
				field: 'reportedValue',
				accession: base,
				message: `Approved ${base} (-300 mV vs SHE, at comparable pH and temperature): differs by 100 mV, more than 2 × √(u₁² + u₂²) = 56.6 mV.`,
				source: describeConflictRule()
			}
		]);
	});

	it('in the CSV check, which stores the rule with each new warning', async () => {
		const csv = [
			'centreAccession,couple,reportedValue,reportedUnit,referenceElectrode,ph,temperatureK,method,uncertaintyMv',
			`${centre},${COUPLE},-270,mV,SHE,${PH},298.15,optical_titration,20`,
			`${centre},${COUPLE},-200,mV,SHE,${PH},298.15,optical_titration,20`,
			`${centre},${COUPLE},-100,mV,SHE,${PH},298.15,optical_titration,`
		].join('\n');
		const check = await checkUpload(db, csv, 'potential', {
			viewer: null,
			limits: uploadCsvLimits
		});
		expect(check.errorCount).toBe(0);
		const conflictsByRow = new Map(
			check.entries.map((e) => [e.row, e.warnings.filter((w) => w.kind === 'conflict')])
		);
		expect(conflictsByRow.get(2)).toEqual([]);
		expect(conflictsByRow.get(4)).toEqual([]);
		expect(conflictsByRow.get(3)).toEqual([
			expect.objectContaining({ accession: base, source: describeConflictRule() })
		]);
		expect(conflictsByRow.get(3)?.[0]?.message).toContain('more than 2 × √(u₁² + u₂²) = 56.6 mV');
	});

	it('in the flags of entry pages, against the rule applied pair by pair', async () => {
		const replicate = await approve(potential(-270, 20));
		const far = await approve(potential(-200, 20));
		const none = await approve(potential(-100, null));
		const rows = await db
			.selectFrom('potential')
			.select(['accession', 'em_mv_she', 'uncertainty_mv', 'ph', 'temperature_k', 'couple'])
			.where('centre_accession', '=', centre)
			.where('couple', '=', COUPLE)
			.where('ph', '=', PH)
			.execute();
		const shown: ListedPotential[] = rows.map((r) => ({
			accession: r.accession,
			centre: { accession: centre },
			couple: r.couple,
			emMvShe: r.em_mv_she,
			uncertaintyMv: r.uncertainty_mv,
			ph: r.ph,
			temperatureK: r.temperature_k
		}));
		expect(shown.map((s) => s.accession).sort()).toEqual([base, replicate, far, none].sort());
		const { flags, notCompared } = await conflictFlags(db, shown, null);
		expect(notCompared).toEqual([none]);
		for (const p of shown) {
			const expected = shown
				.filter((q) => q.accession !== p.accession && potentialConflict(p, q) !== null)
				.map((q) => q.accession)
				.sort();
			expect((flags[p.accession]?.listed ?? []).map((f) => f.accession).sort()).toEqual(expected);
		}
		// −300 and −270 (30 mV, ±20 each) agree; −200 differs from both (100 and 70 mV > 56.6).
		expect(flags[base]?.listed.map((f) => f.accession)).toEqual([far]);
		expect(flags[replicate]?.listed.map((f) => f.accession)).toEqual([far]);
		expect(flags[none]).toBeUndefined();
	});
});
