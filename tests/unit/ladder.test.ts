import { describe, expect, it } from 'vitest';
import { buildLadder } from '$lib/catalogue/ladder';
import type { CentreDto, DistanceDto, PotentialDto } from '$lib/catalogue/dto';

const protein = { accession: 'HL000001', name: 'P', organism: 'O' };
const centre = (n: number): CentreDto => ({
	accession: `HL00010${n}`,
	label: `C${n}`,
	cofactorKind: 'fe4s4',
	version: 1,
	protein,
	ligation: null,
	chainId: null,
	residues: [],
	isDemo: false
});
const ref = (c: CentreDto) => ({
	accession: c.accession,
	label: c.label,
	cofactorKind: c.cofactorKind
});
const potential = (c: CentreDto, em: number, ph: number): PotentialDto => ({
	accession: `HL0002${c.accession.slice(-2)}${ph}`,
	version: 1,
	centre: ref(c),
	protein,
	couple: '[4Fe-4S]2+/1+',
	emMvShe: em,
	reported: { value: em, unit: 'mV', referenceElectrode: 'SHE' },
	ph,
	temperatureK: 298.15,
	ionicStrengthM: null,
	buffer: null,
	method: 'epr_titration',
	nElectrons: 1,
	uncertaintyMv: null,
	source: null,
	isDemo: false
});
const distance = (a: CentreDto, b: CentreDto, edge: number): DistanceDto => ({
	accession: `HL0003${a.label}${b.label}`,
	version: 1,
	centreA: ref(a),
	centreB: ref(b),
	protein,
	edgeToEdgeAngstrom: edge,
	centreToCentreAngstrom: null,
	structureId: 'S',
	method: 'crystal_structure',
	source: null,
	isDemo: false
});

describe('energy ladder', () => {
	const [c1, c2, c3, c4, c5] = [1, 2, 3, 4, 5].map(centre) as [
		CentreDto,
		CentreDto,
		CentreDto,
		CentreDto,
		CentreDto
	];
	it('follows the longest chain, from the low-potential end, skipping hops over 14 Å', () => {
		const ladder = buildLadder(
			[c3, c1, c2, c4, c5],
			[
				potential(c1, 50, 7),
				potential(c2, -100, 7),
				potential(c3, -300, 7),
				potential(c4, -200, 7)
			],
			[distance(c1, c2, 9), distance(c2, c3, 11), distance(c3, c4, 8), distance(c4, c5, 20)]
		);
		expect(ladder.steps.map((s) => s.label)).toEqual(['C4', 'C3', 'C2', 'C1']);
		expect(ladder.hops.map((h) => h.edgeA)).toEqual([8, 11, 9]);
		expect(ladder.branches.map((b) => b.label)).toEqual(['C5']);
	});
	it('takes the potential nearest pH 7 as representative', () => {
		const ladder = buildLadder(
			[c1, c2],
			[potential(c1, -400, 9), potential(c1, -350, 7.2)],
			[distance(c1, c2, 10)]
		);
		expect(ladder.steps.find((s) => s.label === 'C1')?.emMv).toBe(-350);
	});
	it('takes the potential nearest the chosen conditions when the reader chose them', () => {
		const ladder = buildLadder(
			[c1, c2],
			[potential(c1, -400, 9), potential(c1, -350, 7.2)],
			[distance(c1, c2, 10)],
			{ ph: 8.5, temperatureK: 298.15 }
		);
		expect(ladder.steps.find((s) => s.label === 'C1')?.emMv).toBe(-400);
	});
});
