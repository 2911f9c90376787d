import { z } from 'zod';
import {
	apiPageSchema,
	catalogueFacetsSchema,
	centreDtoSchema,
	centreRefSchema,
	distanceDtoSchema,
	entryAnswerSchema,
	facetCountSchema,
	potentialDtoSchema,
	proteinDtoSchema,
	proteinRefSchema,
	sourceRefSchema,
	spinRecordDtoSchema,
	versionSummarySchema
} from '$lib/catalogue/dto';
import { ENTRY_KINDS, KINDS } from '$lib/kinds';
import { apiErrorBodySchema } from '$lib/schemas/apiError';
import {
	hopRateQuerySchema,
	titrationRequestSchema,
	tunnellingRequestSchema
} from '$lib/schemas/calc';
import {
	hopRateResponseSchema,
	titrationResponseSchema,
	tunnellingResponseSchema
} from '$lib/schemas/calcResponses';
import {
	centreApiQuerySchema,
	distanceApiQuerySchema,
	entryApiQuerySchema,
	potentialApiQuerySchema,
	potentialExportQuerySchema,
	potentialFilterSchema,
	proteinApiQuerySchema,
	spinRecordApiQuerySchema
} from '$lib/schemas/catalogueQuery';
import {
	submissionCreatedSchema,
	submissionWithFilesSchema,
	uploadCheckSummarySchema
} from '$lib/schemas/curationResponses';
import { attachmentAnswerSchema } from '$lib/schemas/attachmentResponse';
import { accessionField } from '$lib/schemas/fields';
import {
	SUGGESTION_LIMIT_MAX,
	SUGGESTION_WORDS_MAX,
	suggestionListSchema,
	suggestionQuerySchema,
	suggestionSchema
} from '$lib/schemas/suggestions';
import { apiSubmissionSchema, visibilityRequestSchema } from '$lib/schemas/submission';
import { versionWarningSchema } from '$lib/schemas/versionWarning';
import { fitNernst } from '$lib/science';
import { hopRateAnswer, titrationAnswer, tunnellingAnswer } from '../calc/answers';
import { runTunnelling } from '../calc/tunnelling';
import { uploadCheckQuerySchema, uploadKindField } from '../uploads/uploadForm';
import { attachmentMultipartSchema } from '../attachments/attachmentForm';
import { ATTACHMENT_EXAMPLE, EXAMPLES, REPORTED_POTENTIAL_EXAMPLE } from './examples';

/*
 * Every operation of the API under /api/v1, described once: the zod schemas its route validates
 * with (query, path and body) and the schemas of its answers. `document.ts` turns this table
 * into the OpenAPI document; tests/unit/openapi.test.ts fails when a route file under
 * src/routes/api/v1 has no operation here, or an operation no route.
 */

export type Tag = 'About' | 'Catalogue' | 'Calculators' | 'Contributors';

export const TAGS: Record<Tag, string> = {
	About: 'What the API offers, and this description of it.',
	Catalogue:
		'Approved entries: lists with the search page’s filters (JSON or CSV, cursor paging), one entry at any version, and facet counts. Public data needs no account; a token or a session adds the entries of your groups.',
	Calculators:
		'Electron hop rates, titration fits and proton tunnelling: model estimates with their cautions, never measurements. Titration and tunnelling run in worker threads with a time limit.',
	Contributors:
		'Depositing entries and checking CSV files: contributors only, with a token of scope read+submit or a signed-in session.'
};

/** Who may call an operation: anyone (a token or session widens what reads see), or contributors. */
export type Access = 'anyone' | 'contributor';

/** A query or path value in an example request; lists repeat (or join with commas). */
export type ExampleValue = string | number | boolean | readonly string[];

export interface ApiOperation {
	operationId: string;
	method: 'get' | 'post' | 'delete';
	/** Below /api/v1, with OpenAPI's `{name}` for path parameters. */
	path: string;
	tag: Tag;
	summary: string;
	description: string;
	access: Access;
	pathParams?: Record<string, { schema: z.ZodType; description: string; example: ExampleValue }>;
	/** The route's query schema (its shape; ordered-range refinements are said in `description`). */
	query?: z.ZodObject;
	/** What a parameter means here, where it differs from `PARAMETER_TEXT`. */
	parameterText?: Record<string, string>;
	/** An example request's query and path values: parameter examples and code samples use it. */
	example?: Record<string, ExampleValue>;
	body?: {
		mediaType: 'application/json' | 'multipart/form-data';
		schema: z.ZodType;
		description: string;
		example: unknown;
		/** Multipart: the type each file part is sent as (default: `file` as text/csv). */
		encoding?: Record<string, { contentType: string }>;
	};
	success: {
		status: 200 | 201 | 204;
		description: string;
		/** The name of the answer's schema in `RESPONSE_SCHEMAS`; null: described in words only. */
		schema: ResponseSchemaName | null;
		/** The answer also comes as CSV (with ?format=csv), described so. */
		csv?: string;
		/** The answer is CSV only (no JSON), described so. */
		csvOnly?: string;
		headers?: Record<string, string>;
		/** The operation also answers 304 to a matching `If-None-Match`, described so. */
		notModified?: string;
		/** An example of the answer; the calculators' are computed by the calculators (a function). */
		example?: unknown;
	};
	/** Error statuses the operation may answer besides those every operation may (401, 429, 500). */
	errors: readonly (400 | 403 | 404 | 409 | 413 | 415 | 422 | 503)[];
}

/** Per-kind request bodies of POST /submissions: the API schema with each kind's input schema as `data`. */
function submissionBodySchema() {
	const variants = ENTRY_KINDS.map((kind) => {
		const module = KINDS[kind];
		return apiSubmissionSchema.extend({
			kind: z.literal(kind),
			data: (module.input?.schema ?? module.schema).describe(
				'The entry’s fields, as the entry form of its kind takes them (a potential as reported; it is normalised on the server).'
			),
			visibility: visibilityRequestSchema
				.default({ visibility: 'public', groupId: null, embargoUntil: null })
				.describe(
					'Who may see the entry once approved: public, one group (groupId), or a group until an embargo date (YYYY-MM-DD, UTC).'
				)
		});
	});
	return z.discriminatedUnion('kind', variants as [(typeof variants)[number], ...typeof variants]);
}

/** The API's index: what /api/v1 answers, made from this document (index.ts). */
export const apiIndexSchema = z.strictObject({
	name: z.string(),
	version: z.string(),
	description: z.string(),
	openapi: z.string().describe('The OpenAPI 3.1 document of the API.'),
	reference: z.string().describe('The reference page for people.'),
	endpoints: z.array(
		z.strictObject({
			method: z.enum(['GET', 'POST', 'DELETE']),
			path: z.string(),
			summary: z.string(),
			parameters: z.array(z.string()).describe('Query parameters.')
		})
	),
	errors: z.strictObject({
		shape: z.string(),
		codes: z.array(z.string()).describe('The closed list of error codes.')
	})
});
export type ApiIndex = z.infer<typeof apiIndexSchema>;

/** The answers' schemas, each a named component of the document. */
export const RESPONSE_SCHEMAS = {
	ApiError: apiErrorBodySchema,
	ApiIndex: apiIndexSchema,
	ProteinRef: proteinRefSchema,
	CentreRef: centreRefSchema,
	SourceRef: sourceRefSchema,
	Protein: proteinDtoSchema,
	Centre: centreDtoSchema,
	Potential: potentialDtoSchema,
	SpinRecord: spinRecordDtoSchema,
	Distance: distanceDtoSchema,
	ProteinPage: apiPageSchema(proteinDtoSchema),
	CentrePage: apiPageSchema(centreDtoSchema),
	PotentialPage: apiPageSchema(potentialDtoSchema),
	SpinRecordPage: apiPageSchema(spinRecordDtoSchema),
	DistancePage: apiPageSchema(distanceDtoSchema),
	VersionSummary: versionSummarySchema,
	Entry: entryAnswerSchema,
	FacetCount: facetCountSchema,
	Facets: catalogueFacetsSchema,
	HopRate: hopRateResponseSchema,
	TitrationFit: titrationResponseSchema,
	Tunnelling: tunnellingResponseSchema,
	VersionWarning: versionWarningSchema,
	SubmissionCreated: submissionCreatedSchema,
	Attachment: attachmentAnswerSchema,
	Submission: submissionWithFilesSchema,
	UploadCheck: uploadCheckSummarySchema,
	Suggestion: suggestionSchema,
	SuggestionList: suggestionListSchema
} as const;
export type ResponseSchemaName = keyof typeof RESPONSE_SCHEMAS;

/** What each query parameter means; a test fails when a parameter of an operation has no text. */
export const PARAMETER_TEXT: Record<string, string> = {
	q: 'Free text: protein, organism, centre label, cofactor kind, ligation or accession. Every word must match; the last word is a prefix, and words of five letters or more forgive one typo.',
	kind: 'Cofactor kinds (any of).',
	organism: 'Organisms, exact names (any of).',
	method: 'Methods (any of).',
	emMin: 'Lowest midpoint potential, mV vs SHE.',
	emMax: 'Highest midpoint potential, mV vs SHE.',
	phMin: 'Lowest pH.',
	phMax: 'Highest pH.',
	tMin: 'Lowest temperature, K.',
	tMax: 'Highest temperature, K.',
	protein: 'Only rows of this protein (its accession).',
	centre: 'Only rows of this centre (its accession).',
	spin: 'Total spin S.',
	edgeMin: 'Shortest edge-to-edge distance, Å.',
	edgeMax: 'Longest edge-to-edge distance, Å.',
	sort: 'Sort key; without it, the list’s own order (relevance when searching text).',
	order: 'Sort direction.',
	limit: 'Rows per page.',
	cursor: 'Where the next page starts: `nextCursor` of the previous page, passed back unchanged.',
	format: 'json, or csv for a CSV download of the same rows.',
	version: 'A version number; the latest approved version when omitted.',
	distance:
		'Edge-to-edge distance between the two centres, Å; at least 3.6 Å, van der Waals contact of the edge atoms, where both models reach their contact rate (Moser et al., Nature 355, 796 (1992)): enter centres in contact as 3.6.',
	dG: 'Driving force ΔG° of the forward hop, eV (negative downhill).',
	lambda: 'Reorganization energy λ, eV.',
	model: 'moser-dutton (empirical ruler) or marcus (nonadiabatic Marcus theory).',
	temperature:
		'Temperature, K: the uphill direction follows from the downhill one by detailed balance at T. The Moser–Dutton downhill rate does not depend on it.',
	packing: 'Protein packing density ρ between the centres, 0–1 (0.76 is the ruler’s average).',
	h0: 'Marcus only: electronic coupling at contact, eV (default: the Moser–Dutton calibration).',
	beta: 'Marcus only: distance decay of the coupling, Å⁻¹ (default ln10·(1.2 − 0.8ρ)).'
};

const accession = {
	schema: accessionField,
	description: 'The entry’s accession (HL and six or more digits).',
	example: 'HL000052'
};

const listDescription =
	'JSON by default: `{ items, total, nextCursor, links }`. With `format=csv`, the same rows as CSV (a header row first) with the total in `X-Total-Count` and the next page in `Link`. Filters that take lists repeat or separate values with commas.';

const csvHeaders = {
	'X-Total-Count': 'With format=csv: rows matching the query, over all pages.',
	Link: 'With format=csv: `<url>; rel="next"` when there is a next page.'
};

const TITRATION_EXAMPLE = {
	points: [
		{ potentialMv: -500, signal: 0.98 },
		{ potentialMv: -450, signal: 0.93 },
		{ potentialMv: -400, signal: 0.75 },
		{ potentialMv: -360, signal: 0.46 },
		{ potentialMv: -320, signal: 0.2 },
		{ potentialMv: -280, signal: 0.06 },
		{ potentialMv: -220, signal: 0.01 }
	],
	components: 1,
	n: 1
};

const TUNNELLING_EXAMPLE = { imagFreqCm1: 1200, barrierKJmol: 50, temperatureK: 298.15 };

export const OPERATIONS: readonly ApiOperation[] = [
	{
		operationId: 'getIndex',
		method: 'get',
		path: '/',
		tag: 'About',
		summary: 'What the API offers',
		description:
			'The endpoints with their parameters, and where this document and the reference page are; generated from this document.',
		access: 'anyone',
		success: { status: 200, description: 'The index.', schema: 'ApiIndex' },
		errors: []
	},
	{
		operationId: 'getOpenApiDocument',
		method: 'get',
		path: '/openapi.json',
		tag: 'About',
		summary: 'This OpenAPI 3.1 document',
		description:
			'Generated once per server process from the zod schemas the routes validate with, and served with a strong ETag: send `If-None-Match` to get 304 when it has not changed.',
		access: 'anyone',
		success: {
			status: 200,
			description: 'The OpenAPI document (JSON).',
			schema: null,
			headers: { ETag: 'Changes only when the document does.' },
			notModified: 'Not modified: `If-None-Match` named the current ETag.'
		},
		errors: []
	},
	{
		operationId: 'listPotentials',
		method: 'get',
		path: '/potentials',
		tag: 'Catalogue',
		summary: 'Midpoint potentials',
		description: `Potentials with the search page’s filters and sort orders; \`emMin\` must not exceed \`emMax\`, nor \`phMin\` \`phMax\`, nor \`tMin\` \`tMax\`. ${listDescription}`,
		access: 'anyone',
		query: potentialApiQuerySchema,
		example: { kind: ['fe4s4'], emMin: -400, emMax: -200, sort: 'em', limit: 50 },
		success: {
			status: 200,
			description: 'A page of potentials.',
			schema: 'PotentialPage',
			example: EXAMPLES.potentialPage,
			csv: 'The page as CSV, one row per potential (columns documented at /csv/columns for uploads; the API adds accession, protein and source columns).',
			headers: csvHeaders
		},
		errors: [400]
	},
	{
		operationId: 'exportPotentials',
		method: 'get',
		path: '/potentials/export',
		tag: 'Catalogue',
		summary: 'Every matching potential, as CSV',
		description:
			'All potentials matching the filters, in the chosen order, as one CSV streamed from one read snapshot (approvals during the download change neither count nor rows). The number of rows comes first, in `X-Total-Count`; the body holds the header row and exactly that many rows. Refused with 400 above EXPORT_MAX_ROWS rows, 503 with `Retry-After` while too many exports run.',
		access: 'anyone',
		query: potentialExportQuerySchema,
		example: { kind: ['fe4s4'], sort: 'em' },
		success: {
			status: 200,
			description: 'Every matching potential as CSV.',
			schema: null,
			csvOnly: 'One row per potential after the header row, the columns of the list as CSV.',
			headers: { 'X-Total-Count': 'Rows in the body after the header row.' }
		},
		errors: [400, 503]
	},
	{
		operationId: 'listProteins',
		method: 'get',
		path: '/proteins',
		tag: 'Catalogue',
		summary: 'Proteins and complexes',
		description: `Proteins by text and organism. ${listDescription}`,
		access: 'anyone',
		query: proteinApiQuerySchema,
		parameterText: {
			q: 'Free text: name, organism or accession; the last word is a prefix, words of five letters or more forgive one typo.'
		},
		example: { q: 'ferredoxin', sort: 'name' },
		success: {
			status: 200,
			description: 'A page of proteins.',
			schema: 'ProteinPage',
			example: EXAMPLES.proteinPage,
			csv: 'The page as CSV, one row per protein.',
			headers: csvHeaders
		},
		errors: [400]
	},
	{
		operationId: 'listCentres',
		method: 'get',
		path: '/centres',
		tag: 'Catalogue',
		summary: 'Redox centres',
		description: `Centres by text, cofactor kind, organism and protein. ${listDescription}`,
		access: 'anyone',
		query: centreApiQuerySchema,
		example: { kind: ['fe4s4', 'fe2s2_rieske'], sort: 'protein' },
		success: {
			status: 200,
			description: 'A page of centres.',
			schema: 'CentrePage',
			example: EXAMPLES.centrePage,
			csv: 'The page as CSV, one row per centre.',
			headers: csvHeaders
		},
		errors: [400]
	},
	{
		operationId: 'suggestEntries',
		method: 'get',
		path: '/suggestions',
		tag: 'Catalogue',
		summary: 'Suggestions for a reference field',
		description: `Approved centres, proteins or sources whose accession, name or label contain every typed word (at most ${SUGGESTION_WORDS_MAX} words are used; case does not matter): what an entry form offers while someone types into its centre, protein or source field. Centres match on their label, cofactor type, protein, organism and accession; proteins on name, organism, UniProtKB and accession; sources on title, authors, DOI, journal, year and accession. Only entries the reader may see (a centre only when its protein is visible too); entries awaiting review are never suggested. At most ${SUGGESTION_LIMIT_MAX} answers, no paging: type more to narrow them.`,
		access: 'anyone',
		query: suggestionQuerySchema,
		parameterText: {
			type: 'What to suggest: centre, protein or source.',
			q: 'What was typed: words of a name, label, title, or an accession (or its beginning).',
			limit: `How many suggestions at most (1–${SUGGESTION_LIMIT_MAX}).`
		},
		example: { type: 'centre', q: 'cluster ferredoxin' },
		success: {
			status: 200,
			description:
				'The suggestions, best first: accessions beginning with the text, then labels and names.',
			schema: 'SuggestionList',
			example: {
				items: [
					{
						accession: 'HL000030',
						type: 'centre',
						title: 'Cluster A',
						detail:
							'[4Fe-4S] · FdxT 2[4Fe-4S] ferredoxin (Calorivorax demonstrans HL-1 (fictional))'
					}
				]
			}
		},
		errors: [400]
	},
	{
		operationId: 'listSpinRecords',
		method: 'get',
		path: '/spin-records',
		tag: 'Catalogue',
		summary: 'Spin states and g-values',
		description: `Spin records (S and EPR g-values of one oxidation level of a centre). ${listDescription}`,
		access: 'anyone',
		query: spinRecordApiQuerySchema,
		example: { spin: 0.5, sort: 'temperature' },
		success: {
			status: 200,
			description: 'A page of spin records.',
			schema: 'SpinRecordPage',
			example: EXAMPLES.spinRecordPage,
			csv: 'The page as CSV, one row per spin record.',
			headers: csvHeaders
		},
		errors: [400]
	},
	{
		operationId: 'listDistances',
		method: 'get',
		path: '/distances',
		tag: 'Catalogue',
		summary: 'Distances between centres',
		description: `Edge-to-edge and centre-to-centre distances (Å) between two centres of a protein, as measured in a structure; \`edgeMin\` must not exceed \`edgeMax\`. ${listDescription}`,
		access: 'anyone',
		query: distanceApiQuerySchema,
		example: { edgeMax: 14, sort: 'edge' },
		success: {
			status: 200,
			description: 'A page of distances.',
			schema: 'DistancePage',
			example: EXAMPLES.distancePage,
			csv: 'The page as CSV, one row per distance.',
			headers: csvHeaders
		},
		errors: [400]
	},
	{
		operationId: 'getEntry',
		method: 'get',
		path: '/entries/{accession}',
		tag: 'Catalogue',
		summary: 'One entry at its latest or a given version',
		description:
			'Any kind of entry (protein, centre, potential, spin record, distance, source) with its version history and the titles of the entries it refers to. A version’s data never changes; cite its `permalink`. An entry the reader may not see answers exactly as an unknown accession (404).',
		access: 'anyone',
		pathParams: { accession },
		query: entryApiQuerySchema,
		example: { accession: 'HL000052', version: 1 },
		success: {
			status: 200,
			description: 'The entry at that version.',
			schema: 'Entry',
			example: EXAMPLES.entry
		},
		errors: [400, 404]
	},
	{
		operationId: 'getFacets',
		method: 'get',
		path: '/facets',
		tag: 'Catalogue',
		summary: 'Counts per cofactor kind, organism and method',
		description:
			'Counts of the potentials the reader may see within a search: the same filters as `/potentials`; each facet’s counts apply every filter but that facet’s own, so a count is what adding that choice would give. Without filters, the whole catalogue; totals of proteins and centres are always over the whole catalogue.',
		access: 'anyone',
		query: potentialFilterSchema,
		example: { q: '4Fe4S', method: ['epr_titration'] },
		success: {
			status: 200,
			description: 'The counts.',
			schema: 'Facets',
			example: EXAMPLES.facets
		},
		errors: [400]
	},
	{
		operationId: 'calculateHopRate',
		method: 'get',
		path: '/calc/hop-rate',
		tag: 'Calculators',
		summary: 'Electron hop rate between two centres',
		description:
			'The downhill direction from the Moser–Dutton ruler or nonadiabatic Marcus theory, the uphill one by detailed balance at T (for the ruler this replaces the published −ΔG°/0.06 term, which is the same rule at about 302 K; Page et al., Nature 402, 47–52 (1999)). Runs on the request thread (a closed form).',
		access: 'anyone',
		query: hopRateQuerySchema,
		example: { distance: 9.4, dG: -0.1, lambda: 0.7 },
		success: {
			status: 200,
			description: 'The rates under the chosen model.',
			schema: 'HopRate',
			example: () =>
				hopRateAnswer(hopRateQuerySchema.parse({ distance: 9.4, dG: -0.1, lambda: 0.7 }))
		},
		errors: [400]
	},
	{
		operationId: 'fitTitration',
		method: 'post',
		path: '/calc/titration',
		tag: 'Calculators',
		summary: 'Nernst fit of a redox titration',
		description:
			'One or two Nernstian components, n fixed or fitted (the apparent n), with linearised standard errors and residuals. Potentials are read as mV vs SHE, and Em is given vs SHE. The fit does not depend on the units or offset of the signal. It starts from a grid of Em values across the range (n in 0.5, 1, 2 when fitted), keeps the lowest sum of squares, and warns when other minima fit about as well. When the data show no transition the model can place, the answer has outcome "no_transition" with the reasons, and no Em. Runs in a worker thread: past its time limit the answer is 422, with every worker busy and the queue full 503, and without an account an address may run a limited number of calculations a minute (429); 503 and 429 carry Retry-After.',
		access: 'anyone',
		body: {
			mediaType: 'application/json',
			schema: titrationRequestSchema,
			description:
				'The titration points (potential in mV vs SHE, signal in any unit) and the model.',
			example: TITRATION_EXAMPLE
		},
		success: {
			status: 200,
			description:
				'The fitted components (outcome "fitted"), or why the data give no Em (outcome "no_transition").',
			schema: 'TitrationFit',
			example: () => {
				const { points, ...options } = titrationRequestSchema.parse(TITRATION_EXAMPLE);
				return titrationAnswer(fitNernst(points, options));
			}
		},
		errors: [400, 422, 503]
	},
	{
		operationId: 'calculateTunnelling',
		method: 'post',
		path: '/calc/tunnelling',
		tag: 'Calculators',
		summary: 'Proton and hydride tunnelling',
		description:
			'Wigner and Bell tunnelling factors from an imaginary frequency, and/or the vibrational levels of a double well or a sampled potential (discrete variable representation) with the adiabaticity test and the H/D isotope effect. Bell’s truncated factor is computed in log space: when it exceeds double precision (far below the crossover temperature) `bellTruncated` is null and `bellTruncatedLog10` carries it. The grid is chosen from the potential unless given: the interval grows until every returned level’s wavefunction has decayed to 1e-8 of its peak at both ends, and the points are refined until the levels change by less than 1e-6 relative (at most 600 points); `levels.grid` says what was reached. In a tilted well the splitting is the symmetric part (two-state model); the isotope effect is given only for vibrationally nonadiabatic transfer, rounded to one significant figure. Runs in a worker thread, with the same limits as the titration fit.',
		access: 'anyone',
		body: {
			mediaType: 'application/json',
			schema: tunnellingRequestSchema,
			description:
				'At least an imaginary frequency (imagFreqCm1) or a potential; a potential is a symmetric double well with a tilt, or sampled points. Energies in the units their names carry (kJ/mol, kcal/mol). xMinA and xMaxA (both or neither) fix the grid’s interval, points its number of points; without them both are chosen from the potential.',
			example: TUNNELLING_EXAMPLE
		},
		success: {
			status: 200,
			description: 'Factors and/or levels.',
			schema: 'Tunnelling',
			example: () =>
				tunnellingAnswer(runTunnelling(tunnellingRequestSchema.parse(TUNNELLING_EXAMPLE)))
		},
		errors: [400, 422, 503]
	},
	{
		operationId: 'createSubmission',
		method: 'post',
		path: '/submissions',
		tag: 'Contributors',
		summary: 'Deposit one entry',
		description:
			'A new entry, or with `edit` a new version of an existing one, as a draft or (with `submit: true`) straight into review. `data` holds the entry form’s fields, checked by the same schemas as the forms (a potential as reported: reportedValue, reportedUnit, referenceElectrode; it is normalised to mV vs SHE). Values outside typical ranges or disagreeing with approved ones come back as warnings, never refusals. Errors in `data` are named `data.<field>`.',
		access: 'contributor',
		body: {
			mediaType: 'application/json',
			schema: submissionBodySchema(),
			description:
				'The entry’s kind and data, who may see it, a note to curators, and whether to submit it now.',
			example: {
				kind: 'potential',
				data: {
					...REPORTED_POTENTIAL_EXAMPLE,
					method: 'protein_film_voltammetry'
				},
				changeNote: 'From the second titration of the paper.',
				submit: true
			}
		},
		success: {
			status: 201,
			description: 'The submission, with its warnings.',
			schema: 'SubmissionCreated',
			example: EXAMPLES.submissionCreated,
			headers: { Location: 'The submission in the API.' }
		},
		errors: [400, 403, 409, 413]
	},
	{
		operationId: 'getSubmission',
		method: 'get',
		path: '/submissions/{id}',
		tag: 'Contributors',
		summary: 'One submission',
		description:
			'A submission with its proposed versions, their differences from the approved version, warnings, attached files (with the URLs of their files), reviews and comments — for its contributor or a curator; anyone else gets 404.',
		access: 'contributor',
		pathParams: {
			id: {
				schema: z.number().int().min(1).max(9_999_999_999),
				description: 'The submission’s number.',
				example: 57
			}
		},
		example: { id: 57 },
		success: {
			status: 200,
			description: 'The submission.',
			schema: 'Submission',
			example: EXAMPLES.submissionView
		},
		errors: [403, 404]
	},
	{
		operationId: 'attachToSubmission',
		method: 'post',
		path: '/submissions/{id}/attachments',
		tag: 'Contributors',
		summary: 'Attach a file to a submission',
		description:
			'An image of a spectrum, voltammogram or titration (PNG, JPEG, GIF, BMP, TIFF), optionally with the numbers it was drawn from (two-column text/CSV), or the numbers alone — attached to a version of your own draft or returned submission (a submitted one is frozen until a curator returns it; a CSV batch carries no files, 409). The type is read from the file’s bytes; SVG, HTML, scripts, archives and polyglots are refused (415), as are damaged images, images over the pixel budget and numbers that cannot be plotted (422). The request’s Content-Length is checked before the body is read: at most ATTACHMENT_MAX_BYTES (10 MB by default) for the image, 1 MB for the numbers, and 64 KiB for the rest, else 413. Conditions are flat fields; those that do not apply to the kind are refused. A version carries at most 12 files (409). Someone else’s submission answers 404.',
		access: 'contributor',
		pathParams: {
			id: {
				schema: z.number().int().min(1).max(9_999_999_999),
				description: 'The submission’s number.',
				example: 57
			}
		},
		example: { id: 57 },
		body: {
			mediaType: 'multipart/form-data',
			schema: attachmentMultipartSchema,
			description:
				'The file or files, what they show, a caption, and the conditions that matter for the kind.',
			example: {
				kind: 'epr_spectrum',
				caption: 'X-band EPR of the reduced protein, 15 K',
				temperature: '15',
				microwaveFrequencyGHz: '9.40',
				microwavePowerMw: '2',
				modulationAmplitudeMt: '1',
				file: 'spectrum.png',
				numbers: 'spectrum.csv'
			},
			encoding: { file: { contentType: 'image/png' }, numbers: { contentType: 'text/csv' } }
		},
		success: {
			status: 201,
			description: 'The attachment, with the URLs of its files.',
			schema: 'Attachment',
			example: ATTACHMENT_EXAMPLE,
			headers: { Location: 'The original file.' }
		},
		errors: [400, 403, 404, 409, 413, 415, 422, 503]
	},
	{
		operationId: 'detachFromSubmission',
		method: 'delete',
		path: '/submissions/{id}/attachments/{attachmentId}',
		tag: 'Contributors',
		summary: 'Remove a file from a submission',
		description:
			'Takes an attachment off the version of your own draft or returned submission that lists it. A proposed change starts with the files of the version it changes: removing one here leaves the approved version as it was.',
		access: 'contributor',
		pathParams: {
			id: {
				schema: z.number().int().min(1).max(9_999_999_999),
				description: 'The submission’s number.',
				example: 57
			},
			attachmentId: {
				schema: z.number().int().min(1).max(9_999_999_999),
				description: 'The attachment’s number (`id` in its answer).',
				example: 31
			}
		},
		example: { id: 57, attachmentId: 31 },
		success: { status: 204, description: 'Removed.', schema: null },
		errors: [403, 404, 409]
	},
	{
		operationId: 'checkUpload',
		method: 'post',
		path: '/uploads/check',
		tag: 'Contributors',
		summary: 'Check a CSV file without writing anything',
		description:
			'Check only: a CSV upload checked without writing anything — every row checked by the entry schemas and against the registry (references, duplicates, conflicts). JSON: counts, every issue by row and column, and a preview of what a commit would create; `?format=csv`: the issues as a CSV report (row, column, value, severity, message). Columns and templates: /csv/columns.',
		access: 'contributor',
		query: uploadCheckQuerySchema,
		parameterText: { format: 'json for the check, csv for the issue report as a CSV download.' },
		body: {
			mediaType: 'multipart/form-data',
			schema: z.strictObject({
				kind: uploadKindField,
				file: z.file().mime('text/csv').describe('The CSV file (UTF-8, comma, semicolon or tab).')
			}),
			description: 'The kind of rows and the file.',
			example: { kind: 'potential', file: 'potentials.csv' }
		},
		success: {
			status: 200,
			description: 'The check.',
			schema: 'UploadCheck',
			example: EXAMPLES.uploadCheck,
			csv: 'With format=csv: the issue report (row, column, value, severity, message).'
		},
		errors: [400, 403, 413]
	}
];
