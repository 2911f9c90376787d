import type {
	CatalogueFacets,
	CentreDto,
	CentreRef,
	DistanceDto,
	EntryAnswer,
	PotentialDto,
	ProteinDto,
	ProteinRef,
	SourceRef,
	SpinRecordDto
} from '$lib/catalogue/dto';
import type { ApiErrorBody } from '$lib/schemas/apiError';
import type { AttachmentAnswer } from '$lib/schemas/attachmentResponse';
import type { Potential } from '$lib/schemas/potential';
import type {
	CheckSummary,
	SubmissionCreated,
	SubmissionWithFiles
} from '$lib/schemas/curationResponses';

/** A potential as a contributor reports it: shared by the entry and submission examples. */
export const REPORTED_POTENTIAL_EXAMPLE = {
	centreAccession: 'HL000012',
	couple: '[4Fe-4S]2+/1+',
	reportedValue: -623,
	reportedUnit: 'mV',
	referenceElectrode: 'SCE',
	ph: 7.5,
	temperatureK: 298.15
} as const;

/*
 * Example answers for the OpenAPI document, in the style of the invented demo scenario (the
 * fictional organism and proteins of seed/demo.ts): none of these values is a measurement.
 * Each is typed with the answer's type, and tests/unit/openapi.test.ts validates every example
 * in the document against its schema, so an example cannot drift from what the API sends.
 * The calculators' examples are not written here: the document computes them with the
 * calculators themselves.
 */

const organism = 'Calorivorax demonstrans HL-1 (fictional)';
const ferredoxin: ProteinRef = {
	accession: 'HL000004',
	name: 'FdxT 2[4Fe-4S] ferredoxin',
	organism
};
const clusterA: CentreRef = { accession: 'HL000012', label: 'Cluster A', cofactorKind: 'fe4s4' };
const clusterB: CentreRef = { accession: 'HL000013', label: 'Cluster B', cofactorKind: 'fe4s4' };
const source: SourceRef = {
	accession: 'HL000031',
	doi: '10.5555/demo.2021.014',
	year: 2021,
	firstAuthor: 'Demo, A.'
};

const potential: PotentialDto = {
	accession: 'HL000052',
	version: 1,
	centre: clusterA,
	protein: ferredoxin,
	couple: '[4Fe-4S]2+/1+',
	emMvShe: -382,
	reported: { value: -623, unit: 'mV', referenceElectrode: 'SCE' },
	ph: 7.5,
	temperatureK: 298.15,
	ionicStrengthM: 0.1,
	buffer: 'HEPES 50 mM',
	method: 'protein_film_voltammetry',
	nElectrons: 1,
	uncertaintyMv: 10,
	source,
	isDemo: true
};

const next = (path: string) => `/api/v1/${path}&cursor=bzo1MA`;

const sha = (c: string) => c.repeat(64);

/** An EPR spectrum attached with its numbers (checksums made up for the example). */
export const ATTACHMENT_EXAMPLE: AttachmentAnswer = {
	id: 31,
	kind: 'epr_spectrum',
	role: 'image',
	caption: 'X-band EPR of the reduced protein, 15 K',
	conditions: {
		temperatureK: 15,
		microwaveFrequencyGHz: 9.4,
		microwavePowerMw: 2,
		modulationAmplitudeMt: 1,
		scanRateMvPerS: null,
		referenceElectrode: null
	},
	fileName: 'spectrum.png',
	mediaType: 'image/png',
	byteSize: 48213,
	sha256: sha('a'),
	width: 1600,
	height: 1000,
	preview: { mediaType: 'image/png', width: 1280, height: 800, sha256: sha('b') },
	thumbnail: { mediaType: 'image/png', width: 320, height: 200, sha256: sha('c') },
	numbers: { fileName: 'spectrum.csv', byteSize: 20480, sha256: sha('d') },
	urls: {
		original: 'https://hopline.example/files/31/original',
		preview: 'https://hopline.example/files/31/preview',
		thumbnail: 'https://hopline.example/files/31/thumbnail',
		data: 'https://hopline.example/files/31/data'
	}
};

export const EXAMPLES = {
	potentialPage: {
		items: [potential],
		total: 12,
		offset: 0,
		nextCursor: 'bzo1MA',
		prevCursor: null,
		links: {
			next: next('potentials?kind=fe4s4&emMin=-400&emMax=-200&sort=em&limit=50'),
			prev: null
		}
	},
	proteinPage: {
		items: [
			{
				...ferredoxin,
				version: 1,
				uniprot: null,
				structureIds: ['DS-FDX-04'],
				centreCount: 2,
				isDemo: true
			} satisfies ProteinDto
		],
		total: 1,
		offset: 0,
		nextCursor: null,
		prevCursor: null,
		links: { next: null, prev: null }
	},
	centrePage: {
		items: [
			{
				...clusterA,
				version: 1,
				protein: ferredoxin,
				ligation: 'Cys4',
				chainId: 'A',
				residues: [8, 11, 14, 47],
				isDemo: true
			} satisfies CentreDto
		],
		total: 2,
		offset: 0,
		nextCursor: null,
		prevCursor: null,
		links: { next: null, prev: null }
	},
	spinRecordPage: {
		items: [
			{
				accession: 'HL000071',
				version: 1,
				centre: clusterA,
				protein: ferredoxin,
				oxidationLevel: '[4Fe-4S]1+',
				spinS: 0.5,
				gValues: [2.06, 1.93, 1.89],
				temperatureK: 12,
				method: 'cw_epr_x',
				source,
				isDemo: true
			} satisfies SpinRecordDto
		],
		total: 1,
		offset: 0,
		nextCursor: null,
		prevCursor: null,
		links: { next: null, prev: null }
	},
	distancePage: {
		items: [
			{
				accession: 'HL000090',
				version: 1,
				centreA: clusterA,
				centreB: clusterB,
				protein: ferredoxin,
				edgeToEdgeAngstrom: 9.4,
				centreToCentreAngstrom: 12.1,
				structureId: 'DS-FDX-04',
				method: 'crystal_structure',
				source: null,
				isDemo: true
			} satisfies DistanceDto
		],
		total: 1,
		offset: 0,
		nextCursor: null,
		prevCursor: null,
		links: { next: null, prev: null }
	},
	entry: {
		accession: 'HL000052',
		kind: 'potential',
		isDemo: true,
		version: 1,
		approvedAt: '2026-01-12 09:30:00',
		changeNote: null,
		data: {
			...REPORTED_POTENTIAL_EXAMPLE,
			ionicStrengthM: 0.1,
			buffer: 'HEPES 50 mM',
			method: 'protein_film_voltammetry',
			nElectrons: 1,
			uncertaintyMv: 10,
			sourceAccession: 'HL000031',
			note: null,
			emMvShe: -382
		} satisfies Potential,
		references: {
			centreAccession: {
				accession: 'HL000012',
				kind: 'centre',
				version: 1,
				title: 'Cluster A of FdxT 2[4Fe-4S] ferredoxin',
				permalink: 'https://hopline.example/e/HL000012/v1'
			},
			sourceAccession: {
				accession: 'HL000031',
				kind: 'source',
				version: 1,
				title: 'Demo, A. et al. (2021), Redox chemistry of a fictional ferredoxin',
				permalink: 'https://hopline.example/e/HL000031/v1'
			}
		},
		title: 'Potential of Cluster A, [4Fe-4S]2+/1+',
		permalink: 'https://hopline.example/e/HL000052/v1',
		attachments: [
			{
				id: 7,
				kind: 'voltammogram',
				role: 'image',
				caption: 'Protein-film voltammogram at 20 mV/s (demo data)',
				conditions: {
					temperatureK: 298.15,
					microwaveFrequencyGHz: null,
					microwavePowerMw: null,
					modulationAmplitudeMt: null,
					scanRateMvPerS: 20,
					referenceElectrode: 'AgAgCl_sat'
				},
				fileName: 'cv-tcd-h1.png',
				mediaType: 'image/png',
				byteSize: 18759,
				sha256: '3f1c0b9e6d2a4f8e7b5c1d0a9e8f7a6b5c4d3e2f1a0b9c8d7e6f5a4b3c2d1e0f',
				width: 900,
				height: 560,
				preview: {
					mediaType: 'image/png',
					width: 900,
					height: 560,
					sha256: '5e0d4c3b2a19f8e7d6c5b4a39281706f5e4d3c2b1a09f8e7d6c5b4a392817060'
				},
				thumbnail: {
					mediaType: 'image/png',
					width: 320,
					height: 199,
					sha256: '7c6b5a4938271605f4e3d2c1b0a9f8e7d6c5b4a3928170615e4d3c2b1a09f8e7'
				},
				urls: {
					original: 'https://hopline.example/files/7/original',
					preview: 'https://hopline.example/files/7/preview',
					thumbnail: 'https://hopline.example/files/7/thumbnail',
					data: 'https://hopline.example/files/7/data'
				},
				numbers: {
					fileName: 'cv-tcd-h1.csv',
					byteSize: 16515,
					sha256: 'a0b1c2d3e4f5a6b7c8d9e0f1a2b3c4d5e6f7a8b9c0d1e2f3a4b5c6d7e8f9a0b1'
				}
			}
		],
		live: {
			latestVersion: 2,
			versions: [
				{ version: 1, approvedAt: '2026-01-12 09:30:00', changeNote: null },
				{
					version: 2,
					approvedAt: '2026-02-20 14:05:41',
					changeNote: 'Uncertainty from the erratum.'
				}
			],
			visibility: 'public',
			newerReferences: {}
		}
	} satisfies EntryAnswer,
	facets: {
		kinds: [
			{ value: 'fe4s4', count: 14 },
			{ value: 'heme_c', count: 9 }
		],
		organisms: [{ value: organism, count: 41 }],
		methods: [
			{ value: 'epr_titration', count: 17 },
			{ value: 'protein_film_voltammetry', count: 12 }
		],
		totals: { proteins: 6, centres: 24, potentials: 41 }
	} satisfies CatalogueFacets,
	submissionCreated: {
		id: 57,
		accession: 'HL000140',
		status: 'submitted',
		warnings: [
			{
				kind: 'range',
				field: 'emMvShe',
				message: '+100 mV is outside the typical range for [4Fe-4S]2+/1+ (−700 to −150 mV).',
				source:
					'typical range from a published survey (Liu et al., Chem. Rev. 114, 4366 (2014), potential-range figure); bounds approximate, widened by about 50 mV'
			}
		],
		links: { self: '/api/v1/submissions/57', page: '/submissions/57' }
	} satisfies SubmissionCreated,
	submissionView: {
		submission: {
			id: 57,
			title: 'Potential of Cluster A ([4Fe-4S]2+/1+)',
			status: 'submitted',
			channel: 'form',
			isOwn: true,
			contributor: 'Demo Contributor',
			contributorEmail: 'contributor@demo.hopline.test',
			createdAt: '2026-03-02 10:14:07',
			submittedAt: '2026-03-02 10:14:07',
			updatedAt: '2026-03-02 10:14:07'
		},
		versions: [
			{
				versionId: 311,
				entryId: 140,
				accession: 'HL000140',
				kind: 'potential',
				status: 'submitted',
				data: {
					centreAccession: 'HL000012',
					couple: '[4Fe-4S]2+/1+',
					reportedValue: 0.1,
					reportedUnit: 'V',
					referenceElectrode: 'SHE',
					emMvShe: 100,
					method: 'solution_voltammetry'
				},
				changeNote: null,
				requestedVisibility: {
					visibility: 'public',
					groupName: null,
					groupId: null,
					embargoUntil: null
				},
				current: null,
				changes: [{ field: 'emMvShe', before: null, after: 100 }],
				staleBase: null,
				warnings: [],
				approvedVersion: null,
				attachments: [ATTACHMENT_EXAMPLE]
			}
		],
		comments: [],
		reviews: []
	} satisfies SubmissionWithFiles,
	uploadCheck: {
		kind: 'potential',
		sha256: '9f2c4e0b6a1d3f5e7c9b8a7d6e5f4c3b2a1908f7e6d5c4b3a29180f7e6d5c4b3',
		byteSize: 1832,
		delimiter: ',',
		rowCount: 2,
		columns: [
			{ header: 'centreAccession', column: 'centreAccession' },
			{ header: 'couple', column: 'couple' },
			{ header: 'reportedValue (mV vs SCE)', column: 'reportedValue' },
			{ header: 'method', column: 'method' }
		],
		errorCount: 1,
		warningCount: 0,
		wouldCreate: { entries: 1, proteins: 0 },
		previousUpload: null,
		issues: [
			{
				row: 3,
				column: 'method',
				value: 'epr titraton',
				message: 'not a method; did you mean epr_titration?',
				severity: 'error'
			}
		],
		moreIssues: 0,
		preview: {
			fields: ['centreAccession', 'couple', 'reportedValue', 'emMvShe'],
			rows: [{ row: 2, warnings: 0, cells: ['HL000012', '[4Fe-4S]2+/1+', '−623 mV', '−382 mV'] }]
		}
	} satisfies CheckSummary
};

/** An error body for each status the document lists, as the API sends it. */
export const ERROR_EXAMPLES: Record<number, ApiErrorBody> = {
	400: {
		error: {
			code: 'bad_request',
			message: 'Invalid query parameter(s): emMin',
			fields: { emMin: ['expected a number from -2000 mV to 2000 mV'] }
		}
	},
	401: { error: { code: 'unauthorized', message: 'Sign in first.' } },
	403: { error: { code: 'forbidden', message: 'This needs the contributor role.' } },
	404: {
		error: {
			code: 'not_found',
			message: 'No entry HL999999 in the registry (or not visible to you).'
		}
	},
	409: {
		error: {
			code: 'conflict',
			message: 'You have 250000 rows awaiting review; the limit is 250000.'
		}
	},
	413: {
		error: {
			code: 'payload_too_large',
			message: 'The file is larger than 20 MB.',
			fields: { file: ['The file is larger than 20 MB.'] }
		}
	},
	415: {
		error: {
			code: 'unsupported_media_type',
			message:
				'SVG images are not accepted: they can carry scripts. Export the figure as PNG instead.',
			fields: {
				file: [
					'SVG images are not accepted: they can carry scripts. Export the figure as PNG instead.'
				]
			}
		}
	},
	422: {
		error: {
			code: 'time_limit_exceeded',
			message: 'The calculation took longer than 10 s and was stopped.'
		}
	},
	429: {
		error: {
			code: 'too_many_requests',
			message: 'Too many requests; try again in 20 s.'
		}
	},
	500: {
		error: {
			code: 'internal_error',
			message: 'Internal error; quote the error id when reporting it.',
			errorId: '5b0e7a53-2c5d-4f0b-9d0e-1c1f3e6a2b44'
		}
	},
	503: {
		error: {
			code: 'unavailable',
			message: 'The calculators are busy; try again in 5 s.'
		}
	}
};
