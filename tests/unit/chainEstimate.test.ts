import { describe, expect, it } from 'vitest';
import type { ListedPotential } from '$lib/catalogue/conflicts';
import { buildLadder, type LadderDistance } from '$lib/catalogue/ladder';
import { parseChainChoice, type ChainChoice } from '$lib/schemas/chainChoice';
import type { CofactorKind } from '$lib/schemas/vocabulary';
import {
	TWO_ELECTRON_NOTE,
	choosePotential,
	estimateChain,
	planChain,
	type ChainData
} from '$lib/server/calc/chainEstimate';

/*
 * The chain a protein page estimates. The protein: a respiratory-complex-like relay FMN → C2 →
 * C3 → MK with a side cluster C1 on the FMN (the shape of the demo's RoxA–H), a cluster X beside
 * C2 with no potential, and a cluster FAR with a potential but no neighbour. The rules checked
 * are those the module states (DEVELOPERS.md "Chain estimate on protein pages").
 */

const centre = (n: number, label: string, cofactorKind: CofactorKind) => ({
	accession: `HL0001${String(n).padStart(2, '0')}`,
	label,
	cofactorKind
});
const FMN = centre(1, 'FMN', 'fmn');
const C1 = centre(2, 'C1', 'fe2s2_ferredoxin');
const C2 = centre(3, 'C2', 'fe4s4');
const C3 = centre(4, 'C3', 'fe4s4');
const MK = centre(5, 'MK', 'menaquinone');
const X = centre(6, 'X', 'fe4s4');
const FAR = centre(7, 'FAR', 'fe4s4');
const HIDDEN = 'HL000199'; // a centre of this protein the reader may not see: not in the data

let serial = 0;
const potential = (
	c: { accession: string },
	couple: string,
	emMvShe: number,
	ph = 7,
	extra: Partial<ListedPotential> = {}
): ListedPotential => ({
	accession: `HL0009${String(++serial).padStart(2, '0')}`,
	centre: { accession: c.accession },
	couple,
	emMvShe,
	uncertaintyMv: 20,
	ph,
	temperatureK: 298.15,
	...extra
});
const distance = (
	a: { accession: string },
	b: { accession: string },
	edge: number
): LadderDistance => ({
	centreA: { accession: a.accession, label: '', cofactorKind: 'other' },
	centreB: { accession: b.accession, label: '', cofactorKind: 'other' },
	edgeToEdgeAngstrom: edge
});

function protein(potentials: ListedPotential[]): ChainData {
	return {
		centres: [FMN, C1, C2, C3, MK, X, FAR],
		potentials,
		distances: [
			distance(FMN, C2, 8.4),
			distance(FMN, C1, 7.9),
			distance(C2, C3, 10.9),
			distance(C3, MK, 12.2),
			distance(C2, X, 9)
		]
	};
}
const BASE = [
	potential(FMN, 'ox/hq', -340),
	potential(C1, '[2Fe-2S]2+/1+', -380),
	potential(C2, '[4Fe-4S]2+/1+', -250),
	potential(C3, '[4Fe-4S]2+/1+', -300),
	potential(MK, 'Q/QH2', -80),
	potential(FAR, '[4Fe-4S]2+/1+', -200)
];

function choice(query = ''): ChainChoice {
	const parsed = parseChainChoice(new URLSearchParams(query));
	if (!parsed.ok) throw new Error(JSON.stringify(parsed.fields));
	return parsed.choice;
}
function plan(data: ChainData, query = '') {
	const c = choice(query);
	const ladder = buildLadder(data.centres, data.potentials, data.distances, c.conditions);
	return { ladder, plan: planChain(ladder, data, c) };
}
function planned(data: ChainData, query = '') {
	const { plan: p } = plan(data, query);
	if (!p.ok) throw new Error(JSON.stringify(p.fields));
	return p;
}

describe('default ends', () => {
	it('run from the flavin to the quinone, not from the side cluster where the ladder starts', () => {
		const { ladder, plan: p } = plan(protein(BASE));
		// The ladder's longest path starts at C1, the side branch: the old default entry.
		expect(ladder.steps[0]!.label).toBe('C1');
		expect(p.ok && p.input?.chain.entry).toBe(FMN.accession);
		expect(p.ok && p.input?.chain.exit).toBe(MK.accession);
		expect(p.ok && p.form?.chosen).toBe(false);
	});
	it('include the side branch as hops the electron may take, in the direction of travel', () => {
		const p = planned(protein(BASE));
		const hops = p.input!.chain.hops.map(
			(h) => `${p.input!.labels[h.from]}→${p.input!.labels[h.to]}`
		);
		expect(hops).toEqual(['FMN→C2', 'FMN→C1', 'C2→C3', 'C3→MK']);
		expect(p.input!.leftOut).toEqual(['X']);
	});
	it('fall back on the ladder’s ends when the protein has no substrate site', () => {
		const data = protein(BASE.filter((q) => q.centre.accession !== MK.accession));
		data.centres = data.centres.map((c) => ({ ...c, cofactorKind: 'fe4s4' as const }));
		const p = planned(data);
		expect([p.input!.chain.entry, p.input!.chain.exit]).toEqual([C1.accession, C3.accession]);
	});
});

describe('one-electron couples', () => {
	it('mark a two-electron couple used for want of the one-electron ones, on both ends', () => {
		const p = planned(protein(BASE));
		expect(p.input!.used[FMN.accession]).toMatchObject({
			role: 'entry',
			couple: 'ox/hq',
			approximation: {
				mark: TWO_ELECTRON_NOTE,
				detail: `${TWO_ELECTRON_NOTE} (ox/hq; the one-electron sq/hq couple is not recorded)`
			}
		});
		expect(p.input!.used[MK.accession]).toMatchObject({
			role: 'exit',
			couple: 'Q/QH2',
			approximation: {
				mark: TWO_ELECTRON_NOTE,
				detail: `${TWO_ELECTRON_NOTE} (Q/QH2; the one-electron Q/SQ couple is not recorded)`
			}
		});
		expect(p.input!.used[C2.accession]!.approximation).toBeNull();
	});
	it('use sq/hq at the entry and Q/SQ at the exit where recorded (the old code took ox/hq)', () => {
		const p = planned(
			protein([
				...BASE,
				potential(FMN, 'sq/hq', -390),
				potential(FMN, 'ox/sq', -290),
				potential(MK, 'Q/SQ', -150),
				potential(MK, 'SQ/QH2', -10)
			])
		);
		expect(p.input!.used[FMN.accession]).toMatchObject({
			couple: 'sq/hq',
			emMv: -390,
			approximation: null
		});
		expect(p.input!.used[MK.accession]).toMatchObject({
			couple: 'Q/SQ',
			emMv: -150,
			approximation: null
		});
		expect(p.input!.chain.centres.find((c) => c.id === FMN.accession)!.emMv).toBe(-390);
	});
	it('a flavin in the middle of the chain takes an electron into its oxidised level: ox/sq', () => {
		const data = protein([...BASE, potential(FMN, 'sq/hq', -390), potential(FMN, 'ox/sq', -290)]);
		const p = planned(data, `entry=${C1.accession}&exit=${MK.accession}`);
		expect(p.input!.used[FMN.accession]).toMatchObject({ role: 'relay', couple: 'ox/sq' });
	});
	it('name the one-electron couple standing in for the other', () => {
		const only = new Map([['SQ/QH2', potential(MK, 'SQ/QH2', -10)]]);
		expect(
			choosePotential('menaquinone', only, 'exit', { ph: 7, temperatureK: 298.15 })
		).toMatchObject({
			approximation: {
				mark: 'SQ/QH2 used in place of Q/SQ',
				detail: 'SQ/QH2 used in place of Q/SQ, which is not recorded'
			}
		});
	});
	it('other centres use the first couple their kind lists ([4Fe-4S]2+/1+ before 1+/0)', () => {
		const both = new Map([
			['[4Fe-4S]1+/0', potential(C2, '[4Fe-4S]1+/0', -600, 7)],
			['[4Fe-4S]2+/1+', potential(C2, '[4Fe-4S]2+/1+', -250, 9)]
		]);
		expect(
			choosePotential('fe4s4', both, 'relay', { ph: 7, temperatureK: 298.15 })!.potential.couple
		).toBe('[4Fe-4S]2+/1+');
	});
});

describe('conditions', () => {
	it('take each couple’s value nearest the chosen pH and temperature, and say which', () => {
		const data = protein([
			...BASE,
			potential(C2, '[4Fe-4S]2+/1+', -310, 9, { temperatureK: 338.15 })
		]);
		expect(planned(data).input!.used[C2.accession]).toMatchObject({ emMv: -250, ph: 7 });
		const p = planned(data, 'ph=8.6&temperature=330');
		expect(p.input!.used[C2.accession]).toMatchObject({ emMv: -310, ph: 9, temperatureK: 338.15 });
		expect(p.input!.chain.temperatureK).toBe(330);
		expect(p.form!.conditions).toEqual({ ph: 8.6, temperatureK: 330 });
		expect(p.form!.chosen).toBe(true);
	});
});

describe('the reader’s choice', () => {
	it('runs between the centres chosen; centres beyond the exit are left out', () => {
		const p = planned(protein(BASE), `entry=${C1.accession}&exit=${C3.accession}`);
		expect(p.input!.chain.entry).toBe(C1.accession);
		expect(Object.keys(p.input!.used).sort()).toEqual(
			[C1, FMN, C2, C3].map((c) => c.accession).sort()
		);
	});
	it('answers a hidden centre exactly as a centre that does not exist', () => {
		const hidden = plan(protein(BASE), `entry=${HIDDEN}`).plan;
		const none = plan(protein(BASE), 'entry=HL999999').plan;
		expect(hidden).toEqual({
			ok: false,
			fields: {
				entry: [`no centre ${HIDDEN} among the centres of this protein (or not visible to you)`]
			}
		});
		expect(none.ok === false && none.fields.entry![0]!.replace('HL999999', HIDDEN)).toBe(
			!hidden.ok && hidden.fields.entry![0]
		);
	});
	it('names a visible centre that has no potential to use', () => {
		const p = plan(protein(BASE), `exit=${X.accession}`).plan;
		expect(p).toEqual({
			ok: false,
			fields: {
				exit: [
					`centre X (${X.accession}) has no potential you can see, so the chain cannot end there`
				]
			}
		});
	});
	it('a default end the reader chose for the other end gives way', () => {
		const p = planned(protein(BASE), `entry=${MK.accession}`);
		expect([p.input!.chain.entry, p.input!.chain.exit]).toEqual([MK.accession, FMN.accession]);
	});
	it('says "no chain of hops joins them" only when no path of centres does', () => {
		const p = planned(protein(BASE), `exit=${FAR.accession}`);
		expect(p.input).toBeNull();
		expect(p.note).toBe(
			'No chain of hops joins FMN and FAR: no path of centres with potentials, each within 14 Å edge to edge of the next, links them (X: no potential you can see).'
		);
		// A connected chain at the ends of the range gets an estimate, never that note.
		const extreme = protein([
			potential(FMN, 'ox/hq', -2000),
			potential(C1, '[2Fe-2S]2+/1+', 2000),
			potential(C2, '[4Fe-4S]2+/1+', 2000),
			potential(C3, '[4Fe-4S]2+/1+', -2000),
			potential(MK, 'Q/QH2', 2000)
		]);
		const q = planned(extreme);
		expect(q.note).toBeNull();
		expect(estimateChain(q.input!).result.log10MeanTransitTimeS).toBeGreaterThan(0);
	});
});

describe('estimateChain', () => {
	it('lists the centres held fixed in Monte Carlo, and the hop distances', () => {
		const data = protein(
			BASE.map((q) => (q.centre.accession === C3.accession ? { ...q, uncertaintyMv: null } : q))
		);
		const e = estimateChain(planned(data).input!);
		expect(e.monteCarlo!.fixedCentres).toEqual([C3.accession]);
		expect(e.edgeDistancesA).toEqual([8.4, 7.9, 10.9, 12.2]);
		expect(e.result.hops.map((h) => h.from)).toEqual([FMN, FMN, C2, C3].map((c) => c.accession));
	});
});
