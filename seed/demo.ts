/**
 * The demo scenario. Everything here is invented — organism, proteins, people, journal and
 * numbers — and is loaded with every entry marked as demo data. The values are chosen to be
 * plausible for their cofactor kinds, not taken from any publication. DOIs use the test prefix
 * 10.5555, which is reserved for examples and resolves to nothing.
 */
import type {
	CofactorKind,
	PotentialMethod,
	SpinMethod,
	DistanceMethod
} from '../src/lib/schemas/vocabulary';
import type { ReferenceElectrode } from '../src/lib/science/referenceElectrodes';

export const DEMO_ORGANISM = 'Calorivorax demonstrans HL-1 (fictional)';

export interface DemoSource {
	key: string;
	doi: string;
	title: string;
	authors: string[];
	journal: string;
	year: number;
}

export const DEMO_SOURCES: DemoSource[] = [
	{
		key: 'okafor2021',
		doi: '10.5555/hopline.demo.2021.014',
		title:
			'An eight-cluster electron wire in the respiratory oxidoreductase of a hot-spring bacterium',
		authors: ['Okafor, Adaeze', 'Lindqvist, Maren', 'Tanaka, Hiro'],
		journal: 'Journal of Demonstration Bioenergetics',
		year: 2021
	},
	{
		key: 'lindqvist2022',
		doi: '10.5555/hopline.demo.2022.101',
		title:
			'Temperature dependence of cluster potentials in a thermophilic NADH:quinone oxidoreductase',
		authors: ['Lindqvist, Maren', 'Moreau, Céline'],
		journal: 'Journal of Demonstration Bioenergetics',
		year: 2022
	},
	{
		key: 'rahman2023',
		doi: '10.5555/hopline.demo.2023.007',
		title: 'A membrane-bound hydrogenase-like complex with a high-potential medial cluster',
		authors: ['Rahman, Farid', 'Kowalczyk, Ewa', 'Okafor, Adaeze'],
		journal: 'Invented Letters in Metallobiochemistry',
		year: 2023
	},
	{
		key: 'moreau2020',
		doi: '10.5555/hopline.demo.2020.033',
		title: 'Heme potentials of a tetraheme cytochrome measured by protein film voltammetry',
		authors: ['Moreau, Céline', 'Tanaka, Hiro'],
		journal: 'Invented Letters in Metallobiochemistry',
		year: 2020
	},
	{
		key: 'tanaka2024',
		doi: '10.5555/hopline.demo.2024.052',
		title: 'EPR signatures of the small redox proteins of Calorivorax demonstrans',
		authors: ['Tanaka, Hiro', 'Kowalczyk, Ewa'],
		journal: 'Journal of Demonstration Bioenergetics',
		year: 2024
	},
	{
		key: 'kowalczyk2025',
		doi: '10.5555/hopline.demo.2025.019',
		title: 'Proton-coupled reduction of a Rieske-type cluster across pH 5–10',
		authors: ['Kowalczyk, Ewa', 'Rahman, Farid'],
		journal: 'Invented Letters in Metallobiochemistry',
		year: 2025
	}
];

export interface DemoProtein {
	key: string;
	name: string;
	structureIds: string[];
	description: string;
	centres: DemoCentre[];
}

export interface DemoCentre {
	key: string;
	label: string;
	kind: CofactorKind;
	ligation: string | null;
	chainId: string;
	residues: number[];
	coordinatesA: { x: number; y: number; z: number } | null;
}

const fes = (
	key: string,
	label: string,
	kind: CofactorKind,
	ligation: string | null,
	chainId: string,
	residues: number[],
	coordinatesA: DemoCentre['coordinatesA'] = null
): DemoCentre => ({ key, label, kind, ligation, chainId, residues, coordinatesA });

export const DEMO_PROTEINS: DemoProtein[] = [
	{
		key: 'rox',
		name: 'RoxA–H respiratory NADH:quinone oxidoreductase',
		structureIds: ['DS-ROX-01'],
		description:
			'Demo: a fourteen-subunit respiratory complex whose eight iron–sulfur clusters carry electrons from FMN to menaquinone.',
		centres: [
			fes('rox.fmn', 'FMN', 'fmn', null, 'A', [412], { x: 12.1, y: 40.3, z: 18.0 }),
			fes('rox.c1', 'C1', 'fe2s2_ferredoxin', 'Cys4', 'B', [83, 88, 121, 125], {
				x: 4.9,
				y: 45.0,
				z: 16.2
			}),
			fes('rox.c2', 'C2', 'fe4s4', 'Cys4', 'A', [354, 357, 360, 401], {
				x: 16.0,
				y: 31.5,
				z: 20.9
			}),
			fes('rox.c3', 'C3', 'fe4s4', 'Cys3His', 'C', [97, 101, 104, 113], {
				x: 24.2,
				y: 22.9,
				z: 24.4
			}),
			fes('rox.c4', 'C4', 'fe4s4', 'Cys4', 'C', [186, 189, 192, 233], {
				x: 30.0,
				y: 12.5,
				z: 28.1
			}),
			fes('rox.c5', 'C5', 'fe4s4', 'Cys4', 'D', [44, 47, 50, 92], { x: 37.3, y: 3.6, z: 30.2 }),
			fes('rox.c6', 'C6', 'fe4s4', 'Cys4', 'D', [131, 134, 137, 170], {
				x: 43.7,
				y: -7.0,
				z: 33.5
			}),
			fes('rox.c7', 'C7', 'fe4s4', 'Cys4', 'E', [63, 64, 98, 130], { x: 49.1, y: -17.8, z: 35.0 }),
			fes('rox.mk', 'MK site', 'menaquinone', null, 'F', [], { x: 55.9, y: -28.1, z: 31.7 })
		]
	},
	{
		key: 'hyl',
		name: 'HylSL membrane-bound hydrogenase-like complex',
		structureIds: ['DS-HYL-02'],
		description:
			'Demo: a [NiFe] hydrogenase-like complex with a three-cluster relay and two b-type hemes in its membrane anchor.',
		centres: [
			fes('hyl.nife', 'NiFe site', 'nife', 'Cys4', 'L', [65, 68, 530, 533]),
			fes('hyl.prox', 'Proximal', 'fe4s4', 'Cys4', 'S', [17, 20, 114, 148]),
			fes('hyl.med', 'Medial', 'fe3s4', 'Cys3', 'S', [229, 247, 250]),
			fes('hyl.dist', 'Distal', 'fe4s4', 'Cys3His', 'S', [184, 187, 212, 218]),
			fes('hyl.b1', 'Heme b1', 'heme_b', 'His2', 'M', [71, 186]),
			fes('hyl.b2', 'Heme b2', 'heme_b', 'His2', 'M', [85, 200])
		]
	},
	{
		key: 'tcd',
		name: 'TcdA tetraheme cytochrome c',
		structureIds: ['DS-TCD-03'],
		description: 'Demo: a small periplasmic tetraheme cytochrome with bis-His-ligated hemes.',
		centres: [
			fes('tcd.h1', 'Heme I', 'heme_c', 'His2', 'A', [23, 41]),
			fes('tcd.h2', 'Heme II', 'heme_c', 'His2', 'A', [35, 66]),
			fes('tcd.h3', 'Heme III', 'heme_c', 'His2', 'A', [58, 83]),
			fes('tcd.h4', 'Heme IV', 'heme_c', 'His2', 'A', [79, 102])
		]
	},
	{
		key: 'fdx',
		name: 'FdxT 2[4Fe-4S] ferredoxin',
		structureIds: ['DS-FDX-04'],
		description: 'Demo: a thermostable two-cluster ferredoxin.',
		centres: [
			fes('fdx.a', 'Cluster A', 'fe4s4', 'Cys4', 'A', [8, 11, 14, 47]),
			fes('fdx.b', 'Cluster B', 'fe4s4', 'Cys4', 'A', [18, 37, 40, 43])
		]
	},
	{
		key: 'rsp',
		name: 'RspR Rieske iron–sulfur protein',
		structureIds: ['DS-RSP-05'],
		description: 'Demo: the Rieske subunit of a quinol-oxidising complex.',
		centres: [
			fes('rsp.fes', 'Rieske cluster', 'fe2s2_rieske', 'Cys2His2', 'A', [139, 141, 158, 161])
		]
	},
	{
		key: 'cup',
		name: 'CupA blue copper protein',
		structureIds: ['DS-CUP-06'],
		description: 'Demo: a type-1 copper protein that shuttles electrons to a terminal oxidase.',
		centres: [fes('cup.cu', 'T1 Cu', 'cu_type1', 'His2CysMet', 'A', [46, 84, 89, 94])]
	}
];

/** Potentials as the invented papers report them: value, unit and reference electrode. */
export interface DemoPotential {
	key: string;
	centre: string;
	couple: string;
	value: number;
	unit: 'mV' | 'V';
	electrode: ReferenceElectrode;
	ph: number;
	temperatureK: number;
	method: PotentialMethod;
	n?: number;
	uncertaintyMv?: number;
	buffer?: string;
	ionicStrengthM?: number;
	source: string;
}

const P = (
	key: string,
	centre: string,
	couple: string,
	value: number,
	unit: 'mV' | 'V',
	electrode: ReferenceElectrode,
	ph: number,
	temperatureK: number,
	method: PotentialMethod,
	source: string,
	extra: Partial<DemoPotential> = {}
): DemoPotential => ({
	key,
	centre,
	couple,
	value,
	unit,
	electrode,
	ph,
	temperatureK,
	method,
	source,
	...extra
});

const FE4S4 = '[4Fe-4S]2+/1+';
const FE2S2 = '[2Fe-2S]2+/1+';
const HEME = 'Fe3+/Fe2+';
const R = 298.15;
const HOT = 338.15;

export const DEMO_POTENTIALS: DemoPotential[] = [
	P(
		'p.rox.fmn.1',
		'rox.fmn',
		'ox/hq',
		-340,
		'mV',
		'SHE',
		7.0,
		R,
		'optical_titration',
		'okafor2021',
		{ n: 2, uncertaintyMv: 10, buffer: 'MOPS 50 mM', ionicStrengthM: 0.1 }
	),
	P(
		'p.rox.fmn.2',
		'rox.fmn',
		'ox/hq',
		-0.611,
		'V',
		'SCE',
		8.0,
		R,
		'solution_voltammetry',
		'lindqvist2022',
		{ n: 2, uncertaintyMv: 15, buffer: 'Tris 50 mM' }
	),
	P('p.rox.c1.1', 'rox.c1', FE2S2, -380, 'mV', 'SHE', 7.0, R, 'epr_titration', 'okafor2021', {
		uncertaintyMv: 20,
		buffer: 'MOPS 50 mM',
		ionicStrengthM: 0.1
	}),
	P(
		'p.rox.c1.2',
		'rox.c1',
		FE2S2,
		-616.9,
		'mV',
		'SCE',
		7.5,
		HOT,
		'epr_titration',
		'lindqvist2022',
		{ uncertaintyMv: 25, buffer: 'HEPES 50 mM' }
	),
	P('p.rox.c2.1', 'rox.c2', FE4S4, -250, 'mV', 'SHE', 7.0, R, 'epr_titration', 'okafor2021', {
		uncertaintyMv: 20,
		buffer: 'MOPS 50 mM'
	}),
	P(
		'p.rox.c2.2',
		'rox.c2',
		FE4S4,
		-0.4719,
		'V',
		'SCE',
		7.0,
		HOT,
		'epr_titration',
		'lindqvist2022',
		{ uncertaintyMv: 25 }
	),
	P('p.rox.c3.1', 'rox.c3', FE4S4, -300, 'mV', 'SHE', 7.0, R, 'epr_titration', 'okafor2021', {
		uncertaintyMv: 20
	}),
	P('p.rox.c3.2', 'rox.c3', FE4S4, -548, 'mV', 'SCE', 8.5, R, 'mcd_titration', 'lindqvist2022', {
		uncertaintyMv: 20,
		buffer: 'CHES 20 mM'
	}),
	P('p.rox.c4.1', 'rox.c4', FE4S4, -270, 'mV', 'SHE', 7.0, R, 'epr_titration', 'okafor2021', {
		uncertaintyMv: 20
	}),
	P(
		'p.rox.c4.2',
		'rox.c4',
		FE4S4,
		-491.9,
		'mV',
		'SCE',
		7.0,
		HOT,
		'epr_titration',
		'lindqvist2022',
		{ uncertaintyMv: 30 }
	),
	P('p.rox.c5.1', 'rox.c5', FE4S4, -320, 'mV', 'SHE', 7.0, R, 'epr_titration', 'okafor2021', {
		uncertaintyMv: 25
	}),
	P(
		'p.rox.c5.2',
		'rox.c5',
		FE4S4,
		-555,
		'mV',
		'AgAgCl_sat',
		6.5,
		R,
		'epr_titration',
		'lindqvist2022',
		{ uncertaintyMv: 25 }
	),
	P('p.rox.c6.1', 'rox.c6', FE4S4, -250, 'mV', 'SHE', 7.0, R, 'epr_titration', 'okafor2021', {
		uncertaintyMv: 20
	}),
	P(
		'p.rox.c6.2',
		'rox.c6',
		FE4S4,
		-0.4619,
		'V',
		'SCE',
		7.0,
		HOT,
		'epr_titration',
		'lindqvist2022',
		{ uncertaintyMv: 30 }
	),
	P('p.rox.c7.1', 'rox.c7', FE4S4, -150, 'mV', 'SHE', 7.0, R, 'epr_titration', 'okafor2021', {
		uncertaintyMv: 15
	}),
	P(
		'p.rox.c7.2',
		'rox.c7',
		FE4S4,
		-392,
		'mV',
		'SCE',
		7.0,
		318.15,
		'protein_film_voltammetry',
		'lindqvist2022',
		{ uncertaintyMv: 10, buffer: 'mixed buffer 20 mM' }
	),
	P(
		'p.rox.mk.1',
		'rox.mk',
		'Q/QH2',
		-80,
		'mV',
		'SHE',
		7.0,
		R,
		'solution_voltammetry',
		'okafor2021',
		{ n: 2, uncertaintyMv: 15 }
	),
	P(
		'p.rox.mk.2',
		'rox.mk',
		'Q/QH2',
		-0.335,
		'V',
		'AgAgCl_1M',
		8.0,
		R,
		'solution_voltammetry',
		'lindqvist2022',
		{ n: 2, uncertaintyMv: 20 }
	),
	P(
		'p.hyl.nife.1',
		'hyl.nife',
		'Ni-SI/Ni-C',
		-300,
		'mV',
		'SHE',
		7.0,
		R,
		'epr_titration',
		'rahman2023',
		{ uncertaintyMv: 15 }
	),
	P(
		'p.hyl.nife.2',
		'hyl.nife',
		'Ni-C/Ni-R',
		-370,
		'mV',
		'SHE',
		7.0,
		R,
		'epr_titration',
		'rahman2023',
		{ uncertaintyMv: 15 }
	),
	P(
		'p.hyl.nife.3',
		'hyl.nife',
		'Ni-SI/Ni-C',
		-0.5599,
		'V',
		'SCE',
		8.0,
		HOT,
		'epr_titration',
		'rahman2023',
		{ uncertaintyMv: 20 }
	),
	P('p.hyl.prox.1', 'hyl.prox', FE4S4, -340, 'mV', 'SHE', 7.0, R, 'epr_titration', 'rahman2023', {
		uncertaintyMv: 20
	}),
	P('p.hyl.prox.2', 'hyl.prox', FE4S4, -575, 'mV', 'SCE', 6.0, R, 'epr_titration', 'rahman2023', {
		uncertaintyMv: 20
	}),
	P(
		'p.hyl.med.1',
		'hyl.med',
		'[3Fe-4S]1+/0',
		60,
		'mV',
		'SHE',
		7.0,
		R,
		'epr_titration',
		'rahman2023',
		{ uncertaintyMv: 10 }
	),
	P(
		'p.hyl.med.2',
		'hyl.med',
		'[3Fe-4S]1+/0',
		-0.1549,
		'V',
		'SCE',
		7.0,
		HOT,
		'protein_film_voltammetry',
		'rahman2023',
		{ uncertaintyMv: 10 }
	),
	P('p.hyl.dist.1', 'hyl.dist', FE4S4, -200, 'mV', 'SHE', 7.0, R, 'epr_titration', 'rahman2023', {
		uncertaintyMv: 20
	}),
	P(
		'p.hyl.dist.2',
		'hyl.dist',
		FE4S4,
		-455,
		'mV',
		'SCE',
		7.0,
		318.15,
		'epr_titration',
		'rahman2023',
		{ uncertaintyMv: 25 }
	),
	P('p.hyl.b1.1', 'hyl.b1', HEME, -90, 'mV', 'SHE', 7.0, R, 'optical_titration', 'rahman2023', {
		uncertaintyMv: 10
	}),
	P(
		'p.hyl.b1.2',
		'hyl.b1',
		HEME,
		-0.3019,
		'V',
		'SCE',
		7.0,
		HOT,
		'spectroelectrochemistry',
		'rahman2023',
		{ uncertaintyMv: 15 }
	),
	P('p.hyl.b2.1', 'hyl.b2', HEME, 40, 'mV', 'SHE', 7.0, R, 'optical_titration', 'rahman2023', {
		uncertaintyMv: 10
	}),
	P(
		'p.hyl.b2.2',
		'hyl.b2',
		HEME,
		-205,
		'mV',
		'SCE',
		7.0,
		R,
		'spectroelectrochemistry',
		'rahman2023',
		{ uncertaintyMv: 10 }
	),
	P(
		'p.tcd.h1.1',
		'tcd.h1',
		HEME,
		-120,
		'mV',
		'SHE',
		7.0,
		R,
		'protein_film_voltammetry',
		'moreau2020',
		{ uncertaintyMv: 10, buffer: 'phosphate 20 mM', ionicStrengthM: 0.1 }
	),
	P(
		'p.tcd.h1.2',
		'tcd.h1',
		HEME,
		-335,
		'mV',
		'AgAgCl_3M',
		8.0,
		R,
		'protein_film_voltammetry',
		'moreau2020',
		{ uncertaintyMv: 10, buffer: 'phosphate 20 mM' }
	),
	P(
		'p.tcd.h2.1',
		'tcd.h2',
		HEME,
		-180,
		'mV',
		'SHE',
		7.0,
		R,
		'protein_film_voltammetry',
		'moreau2020',
		{ uncertaintyMv: 10 }
	),
	P(
		'p.tcd.h2.2',
		'tcd.h2',
		HEME,
		-0.39,
		'V',
		'AgAgCl_3M',
		8.0,
		R,
		'protein_film_voltammetry',
		'moreau2020',
		{ uncertaintyMv: 10 }
	),
	P(
		'p.tcd.h3.1',
		'tcd.h3',
		HEME,
		-240,
		'mV',
		'SHE',
		7.0,
		R,
		'protein_film_voltammetry',
		'moreau2020',
		{ uncertaintyMv: 10 }
	),
	P(
		'p.tcd.h3.2',
		'tcd.h3',
		HEME,
		-0.475,
		'V',
		'SCE',
		7.0,
		288.15,
		'protein_film_voltammetry',
		'moreau2020',
		{ uncertaintyMv: 15 }
	),
	P(
		'p.tcd.h4.1',
		'tcd.h4',
		HEME,
		-300,
		'mV',
		'SHE',
		7.0,
		R,
		'protein_film_voltammetry',
		'moreau2020',
		{ uncertaintyMv: 10 }
	),
	P(
		'p.tcd.h4.2',
		'tcd.h4',
		HEME,
		-520,
		'mV',
		'AgAgCl_3M',
		8.0,
		R,
		'optical_titration',
		'moreau2020',
		{ uncertaintyMv: 15 }
	),
	P('p.fdx.a.1', 'fdx.a', FE4S4, -420, 'mV', 'SHE', 7.0, R, 'epr_titration', 'tanaka2024', {
		uncertaintyMv: 15
	}),
	P(
		'p.fdx.a.2',
		'fdx.a',
		FE4S4,
		-0.6249,
		'V',
		'SCE',
		7.0,
		HOT,
		'protein_film_voltammetry',
		'tanaka2024',
		{ uncertaintyMv: 10 }
	),
	P('p.fdx.b.1', 'fdx.b', FE4S4, -460, 'mV', 'SHE', 7.0, R, 'epr_titration', 'tanaka2024', {
		uncertaintyMv: 15
	}),
	P(
		'p.fdx.b.2',
		'fdx.b',
		FE4S4,
		-700,
		'mV',
		'SCE',
		7.0,
		R,
		'protein_film_voltammetry',
		'tanaka2024',
		{ uncertaintyMv: 10 }
	),
	P('p.rsp.1', 'rsp.fes', FE2S2, 280, 'mV', 'SHE', 7.0, R, 'optical_titration', 'kowalczyk2025', {
		uncertaintyMv: 10
	}),
	P(
		'p.rsp.2',
		'rsp.fes',
		FE2S2,
		0.025,
		'V',
		'AgAgCl_sat',
		9.0,
		R,
		'protein_film_voltammetry',
		'kowalczyk2025',
		{ uncertaintyMv: 10 }
	),
	P(
		'p.rsp.3',
		'rsp.fes',
		FE2S2,
		-80,
		'mV',
		'SCE',
		10.0,
		R,
		'protein_film_voltammetry',
		'kowalczyk2025',
		{ uncertaintyMv: 15 }
	),
	P(
		'p.rsp.4',
		'rsp.fes',
		FE2S2,
		300,
		'mV',
		'SHE',
		5.5,
		R,
		'protein_film_voltammetry',
		'kowalczyk2025',
		{ uncertaintyMv: 10 }
	),
	P('p.cup.1', 'cup.cu', 'Cu2+/Cu+', 340, 'mV', 'SHE', 7.0, R, 'optical_titration', 'tanaka2024', {
		uncertaintyMv: 5
	}),
	P(
		'p.cup.2',
		'cup.cu',
		'Cu2+/Cu+',
		0.115,
		'V',
		'AgAgCl_3M',
		6.0,
		R,
		'solution_voltammetry',
		'tanaka2024',
		{ uncertaintyMv: 5 }
	)
];

export interface DemoSpin {
	centre: string;
	level: string;
	spinS: number;
	g: number[];
	temperatureK: number;
	method: SpinMethod;
	source: string;
}

export const DEMO_SPIN_RECORDS: DemoSpin[] = [
	{
		centre: 'rox.fmn',
		level: 'FMN semiquinone',
		spinS: 0.5,
		g: [2.004],
		temperatureK: 80,
		method: 'cw_epr_x',
		source: 'okafor2021'
	},
	{
		centre: 'rox.c1',
		level: '[2Fe-2S]1+',
		spinS: 0.5,
		g: [2.02, 1.94, 1.92],
		temperatureK: 40,
		method: 'cw_epr_x',
		source: 'okafor2021'
	},
	{
		centre: 'rox.c2',
		level: '[4Fe-4S]1+',
		spinS: 0.5,
		g: [2.05, 1.93, 1.89],
		temperatureK: 12,
		method: 'cw_epr_x',
		source: 'okafor2021'
	},
	{
		centre: 'rox.c3',
		level: '[4Fe-4S]1+',
		spinS: 0.5,
		g: [2.07, 1.92, 1.88],
		temperatureK: 12,
		method: 'cw_epr_x',
		source: 'okafor2021'
	},
	{
		centre: 'rox.c4',
		level: '[4Fe-4S]1+',
		spinS: 0.5,
		g: [2.04, 1.94, 1.9],
		temperatureK: 10,
		method: 'cw_epr_x',
		source: 'okafor2021'
	},
	{
		centre: 'rox.c5',
		level: '[4Fe-4S]1+',
		spinS: 0.5,
		g: [2.1, 1.93, 1.87],
		temperatureK: 8,
		method: 'cw_epr_q',
		source: 'lindqvist2022'
	},
	{
		centre: 'rox.c6',
		level: '[4Fe-4S]1+',
		spinS: 0.5,
		g: [2.06, 1.92, 1.9],
		temperatureK: 10,
		method: 'cw_epr_x',
		source: 'okafor2021'
	},
	{
		centre: 'rox.c7',
		level: '[4Fe-4S]1+',
		spinS: 0.5,
		g: [2.03, 1.95, 1.91],
		temperatureK: 15,
		method: 'cw_epr_x',
		source: 'okafor2021'
	},
	{
		centre: 'hyl.nife',
		level: 'Ni-C',
		spinS: 0.5,
		g: [2.21, 2.14, 2.01],
		temperatureK: 70,
		method: 'cw_epr_x',
		source: 'rahman2023'
	},
	{
		centre: 'hyl.med',
		level: '[3Fe-4S]1+',
		spinS: 0.5,
		g: [2.02, 2.0, 1.98],
		temperatureK: 10,
		method: 'cw_epr_x',
		source: 'rahman2023'
	},
	{
		centre: 'hyl.prox',
		level: '[4Fe-4S]1+',
		spinS: 0.5,
		g: [2.04, 1.93, 1.88],
		temperatureK: 10,
		method: 'cw_epr_x',
		source: 'rahman2023'
	},
	{
		centre: 'tcd.h1',
		level: 'Fe3+ low-spin',
		spinS: 0.5,
		g: [2.95, 2.27, 1.52],
		temperatureK: 10,
		method: 'cw_epr_x',
		source: 'moreau2020'
	},
	{
		centre: 'tcd.h3',
		level: 'Fe3+ low-spin',
		spinS: 0.5,
		g: [3.05, 2.22, 1.45],
		temperatureK: 10,
		method: 'cw_epr_x',
		source: 'moreau2020'
	},
	{
		centre: 'fdx.a',
		level: '[4Fe-4S]1+',
		spinS: 0.5,
		g: [2.06, 1.94, 1.9],
		temperatureK: 12,
		method: 'cw_epr_x',
		source: 'tanaka2024'
	},
	{
		centre: 'rsp.fes',
		level: '[2Fe-2S]1+',
		spinS: 0.5,
		g: [2.03, 1.9, 1.79],
		temperatureK: 20,
		method: 'cw_epr_x',
		source: 'kowalczyk2025'
	},
	{
		centre: 'cup.cu',
		level: 'Cu2+',
		spinS: 0.5,
		g: [2.27, 2.05],
		temperatureK: 77,
		method: 'cw_epr_x',
		source: 'tanaka2024'
	},
	{
		centre: 'rox.c5',
		level: '[4Fe-4S]2+',
		spinS: 0,
		g: [],
		temperatureK: 4.2,
		method: 'mossbauer',
		source: 'lindqvist2022'
	}
];

export interface DemoDistance {
	a: string;
	b: string;
	edgeA: number;
	centreA: number;
	structureId: string;
	method: DistanceMethod;
	source: string;
}

const D = (
	a: string,
	b: string,
	edgeA: number,
	centreA: number,
	structureId: string,
	source: string
): DemoDistance => ({
	a,
	b,
	edgeA,
	centreA,
	structureId,
	method: 'crystal_structure',
	source
});

export const DEMO_DISTANCES: DemoDistance[] = [
	D('rox.fmn', 'rox.c2', 8.4, 13.2, 'DS-ROX-01', 'okafor2021'),
	D('rox.fmn', 'rox.c1', 7.9, 12.6, 'DS-ROX-01', 'okafor2021'),
	D('rox.c2', 'rox.c3', 10.9, 14.3, 'DS-ROX-01', 'okafor2021'),
	D('rox.c3', 'rox.c4', 9.7, 13.6, 'DS-ROX-01', 'okafor2021'),
	D('rox.c4', 'rox.c5', 10.4, 13.9, 'DS-ROX-01', 'okafor2021'),
	D('rox.c5', 'rox.c6', 12.6, 16.4, 'DS-ROX-01', 'okafor2021'),
	D('rox.c6', 'rox.c7', 11.3, 15.2, 'DS-ROX-01', 'okafor2021'),
	D('rox.c7', 'rox.mk', 12.2, 15.8, 'DS-ROX-01', 'okafor2021'),
	D('hyl.nife', 'hyl.prox', 10.6, 12.9, 'DS-HYL-02', 'rahman2023'),
	D('hyl.prox', 'hyl.med', 9.8, 12.2, 'DS-HYL-02', 'rahman2023'),
	D('hyl.med', 'hyl.dist', 10.3, 12.4, 'DS-HYL-02', 'rahman2023'),
	D('hyl.dist', 'hyl.b1', 13.1, 17.5, 'DS-HYL-02', 'rahman2023'),
	D('hyl.b1', 'hyl.b2', 11.0, 15.1, 'DS-HYL-02', 'rahman2023'),
	D('tcd.h1', 'tcd.h2', 6.2, 11.4, 'DS-TCD-03', 'moreau2020'),
	D('tcd.h2', 'tcd.h3', 7.4, 12.0, 'DS-TCD-03', 'moreau2020'),
	D('tcd.h3', 'tcd.h4', 5.9, 10.9, 'DS-TCD-03', 'moreau2020'),
	D('fdx.a', 'fdx.b', 8.9, 12.1, 'DS-FDX-04', 'tanaka2024')
];

/**
 * Later versions of some entries, approved after the first, so that history, diffs and
 * versioned permalinks have something to show. Each names its entry by key and the fields it
 * changes.
 */
export interface DemoRevision {
	entry: string;
	changes: Record<string, unknown>;
	note: string;
	approvedAt: string;
}

export const DEMO_REVISIONS: DemoRevision[] = [
	{
		entry: 'p.rox.c5.1',
		changes: { reportedValue: -335, uncertaintyMv: 15 },
		note: 'Corrected after re-analysis of the EPR titration with a two-component fit.',
		approvedAt: '2024-03-11T09:30:00.000Z'
	},
	{
		entry: 'p.rox.c5.1',
		changes: { buffer: 'MOPS 50 mM, KCl 100 mM', ionicStrengthM: 0.15 },
		note: 'Buffer composition completed from the supplementary methods.',
		approvedAt: '2025-01-20T14:05:00.000Z'
	},
	{
		entry: 'rox.c3',
		changes: { ligation: 'Cys3His' },
		note: 'Ligation confirmed as Cys3His in the refined structure.',
		approvedAt: '2024-06-02T08:00:00.000Z'
	},
	{
		entry: 'p.hyl.med.1',
		changes: { reportedValue: 65, uncertaintyMv: 8, method: 'protein_film_voltammetry' },
		note: 'Replaced by the protein film voltammetry value from the same study.',
		approvedAt: '2024-09-15T16:45:00.000Z'
	},
	{
		entry: 'rox',
		changes: { structureIds: ['DS-ROX-01', 'DS-ROX-01b'] },
		note: 'Added the reduced-state structure.',
		approvedAt: '2025-05-08T10:00:00.000Z'
	}
];
