import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Database } from '$lib/server/db/schema';
import { hopPair } from '$lib/server/calc/hopPair';
import { DEFAULT_CHAIN_CONDITIONS } from '$lib/schemas/chainConditions';
import { buildHiddenFixtures, HIDDEN_MARKS, type HiddenFixtures } from '../support/hiddenFixtures';
import { createTempDatabase } from '../support/tempDb';

/*
 * The hop-rate calculator's two centres from the registry, on the invented demo scenario plus
 * entries only the demo consortium may see (tests/support/hiddenFixtures.ts). Oracle for the
 * numbers: seed/demo.ts — RoxA–H's FMN (ox/hq −340 mV vs SHE at pH 7, p.rox.fmn.1; another
 * ox/hq at pH 8, p.rox.fmn.2) and its cluster C2 ([4Fe-4S]2+/1+ −250 mV at pH 7), 8.4 Å edge to
 * edge and 13.2 Å centre to centre in DS-ROX-01: ΔG° = (−340 − (−250)) mV = −0.090 eV.
 */
let db: Kysely<Database>;
let remove: () => Promise<void>;
let fx: HiddenFixtures;
let fmn: string;
let c2: string;
const conditions = DEFAULT_CHAIN_CONDITIONS;

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	fx = await buildHiddenFixtures(db);
	const centre = async (label: string) =>
		(
			await db
				.selectFrom('centre as c')
				.innerJoin('entry as e', 'e.id', 'c.entry_id')
				.innerJoin('protein as p', 'p.entry_id', 'c.protein_entry_id')
				.select('e.accession')
				.where('c.label', '=', label)
				.where('p.name', 'like', 'RoxA%')
				.executeTakeFirstOrThrow()
		).accession;
	fmn = await centre('FMN');
	c2 = await centre('C2');
	// Loading the demo scenario with its accounts (password hashes) takes a while on 2 cores.
}, 120_000);
afterAll(async () => remove());

describe('hopPair', () => {
	it('fills ΔG° from the two potentials and the distance from the entry between them', async () => {
		const pair = await hopPair(db, { donor: fmn, acceptor: c2 }, null, conditions);
		expect(pair.errors).toEqual({});
		expect(pair.protein?.name).toMatch(/^RoxA/);
		expect(pair.dG?.ev).toBeCloseTo(-0.09, 12);
		expect(pair.dG?.text).toBe('−0.09');
		expect(pair.dG?.donor).toMatchObject({ couple: 'ox/hq', emMv: -340, ph: 7 });
		// No sq/hq couple is recorded for this flavin: the two-electron couple stands in, said so.
		expect(pair.dG?.donor.approximation).toMatch(/two-electron couple used as an approximation/);
		expect(pair.dG?.acceptor).toMatchObject({ couple: '[4Fe-4S]2+/1+', emMv: -250 });
		expect(pair.distance).toMatchObject({ angstrom: 8.4, text: '8.4', centreToCentreA: 13.2 });
		expect(pair.distance?.structureId).toBe('DS-ROX-01');
		// The protein's centres are offered for the choice, each once.
		const offered = pair.centres.map((c) => c.accession);
		expect(offered).toContain(fmn);
		expect(new Set(offered).size).toBe(offered.length);
	});

	it('chooses each potential nearest the pH asked for', async () => {
		const pair = await hopPair(db, { donor: fmn, acceptor: c2, ph: 8 }, null, {
			...conditions,
			ph: 8
		});
		expect(pair.dG?.donor.ph).toBe(8);
		expect(pair.dG?.ev).toBeCloseTo((pair.dG!.donor.emMv - -250) / 1000, 12);
	});

	it('reads the centres in the order asked: swapping them changes the sign of ΔG°', async () => {
		const pair = await hopPair(db, { donor: c2, acceptor: fmn }, null, conditions);
		// C2 gives the electron; FMN takes it into its oxidised level (ox/hq stands in for ox/sq).
		expect(pair.dG?.ev).toBeCloseTo(0.09, 12);
	});

	it('finds the protein by words of its name, and lists several when several match', async () => {
		const one = await hopPair(db, { protein: 'RoxA' }, null, conditions);
		expect(one.protein?.name).toMatch(/^RoxA/);
		expect(one.centres.length).toBeGreaterThan(2);
		const none = await hopPair(db, { protein: 'Zzzznothing' }, null, conditions);
		expect(none.errors.protein?.[0]).toMatch(/no protein you can see matches/);
	});

	it('refuses the same centre at both ends', async () => {
		const pair = await hopPair(db, { donor: fmn, acceptor: fmn }, null, conditions);
		expect(pair.errors.acceptor).toEqual(['choose a centre other than the donor']);
		expect(pair.dG).toBeNull();
	});
});

describe('hopPair never reveals what the reader may not see', () => {
	const outsiders = [
		['signed out', null],
		['a reader in no group', { groupIds: [] }]
	] as const;
	const strip = (value: unknown, accession: string) =>
		JSON.parse(JSON.stringify(value).replaceAll(accession, 'HLxxxxxx'));

	for (const [who, viewer] of outsiders) {
		it(`answers ${who} about a group-only centre exactly as about one that does not exist`, async () => {
			const hidden = await hopPair(
				db,
				{ donor: fx.hiddenCentre, acceptor: fx.publicCentre },
				viewer,
				conditions
			);
			const missing = await hopPair(
				db,
				{ donor: 'HL999999', acceptor: fx.publicCentre },
				viewer,
				conditions
			);
			expect(strip(hidden, fx.hiddenCentre)).toEqual(strip(missing, 'HL999999'));
			expect(hidden.errors.donor?.[0]).toMatch(/no centre HL\d+ in the registry/);
			expect(JSON.stringify(hidden)).not.toContain(HIDDEN_MARKS.centreLabel);
		});

		it(`answers ${who} about a group-only protein as about one that does not exist`, async () => {
			const hidden = await hopPair(db, { protein: fx.hiddenProtein }, viewer, conditions);
			const missing = await hopPair(db, { protein: 'HL999998' }, viewer, conditions);
			expect(strip(hidden, fx.hiddenProtein)).toEqual(strip(missing, 'HL999998'));
		});

		it(`gives ${who} neither the hidden centre as a choice nor a hidden value`, async () => {
			const pair = await hopPair(db, { protein: fx.publicProtein }, viewer, conditions);
			expect(pair.centres.map((c) => c.accession)).not.toContain(fx.hiddenCentre);
			for (const other of pair.centres.filter((c) => c.accession !== fx.publicCentre)) {
				const filled = await hopPair(
					db,
					{ donor: fx.publicCentre, acceptor: other.accession },
					viewer,
					conditions
				);
				const text = JSON.stringify(filled);
				expect(text).not.toContain(fx.hiddenPotential);
				expect(text).not.toContain(fx.embargoedPotential);
				expect(text).not.toContain(String(HIDDEN_MARKS.potentialMv));
			}
		});
	}

	it('lets a member of the group choose the group-only centre (the control)', async () => {
		const pair = await hopPair(
			db,
			{ protein: fx.publicProtein, donor: fx.hiddenCentre },
			{ groupIds: [fx.groupId] },
			conditions
		);
		expect(pair.errors).toEqual({});
		expect(pair.donor?.label).toBe(HIDDEN_MARKS.centreLabel);
		expect(pair.centres.map((c) => c.accession)).toContain(fx.hiddenCentre);
	});
});
