import { z } from 'zod';
import { REFERENCE_ELECTRODES } from '$lib/science/referenceElectrodes';
import { POTENTIAL_UNITS } from '$lib/science/units';
import {
	COFACTOR_KINDS,
	DISTANCE_METHODS,
	POTENTIAL_METHODS,
	SPIN_METHODS,
	VISIBILITIES
} from '$lib/schemas/vocabulary';
import { ENTRY_KINDS } from '$lib/kinds';

/*
 * The shapes the catalogue hands to pages and API clients (camelCase, units in the names).
 * Built from database rows by one mapper per entity in src/lib/server/catalogue/mappers.ts.
 *
 * Each shape is a zod schema and its TypeScript type is inferred from it: the OpenAPI document
 * (src/lib/server/openapi) describes the API's answers with these schemas, and the HTTP tests
 * check real answers against that description, so the types, the document and the answers
 * cannot drift apart. Nothing parses with them at run time.
 */

const accession = z.string().describe('Accession: HL and six or more digits.');
const version = z.number().int().min(1).describe('Version number, from 1, without gaps.');
const isDemo = z.boolean().describe('True for the invented demo scenario; never a measurement.');
const count = z.number().int().min(0);

export const entryRefSchema = z.strictObject({ accession });
export type EntryRef = z.infer<typeof entryRefSchema>;

export const proteinRefSchema = entryRefSchema.extend({
	name: z.string(),
	organism: z.string()
});
export type ProteinRef = z.infer<typeof proteinRefSchema>;

export const centreRefSchema = entryRefSchema.extend({
	label: z.string(),
	cofactorKind: z.enum(COFACTOR_KINDS)
});
export type CentreRef = z.infer<typeof centreRefSchema>;

export const sourceRefSchema = entryRefSchema.extend({
	doi: z.string().nullable(),
	year: z.number().int().nullable(),
	firstAuthor: z.string().nullable()
});
export type SourceRef = z.infer<typeof sourceRefSchema>;

const sourceOrNone = sourceRefSchema
	.nullable()
	.describe('The source of the value; null when none is named or the reader may not see it.');

export const proteinDtoSchema = proteinRefSchema.extend({
	version,
	uniprot: z.string().nullable().describe('UniProtKB accession.'),
	structureIds: z.array(z.string()).describe('Structure identifiers (PDB and others).'),
	centreCount: count.describe('Redox centres of the protein the reader may see.'),
	isDemo
});
export type ProteinDto = z.infer<typeof proteinDtoSchema>;

export const centreDtoSchema = centreRefSchema.extend({
	version,
	protein: proteinRefSchema,
	ligation: z.string().nullable().describe('Ligating residues, e.g. Cys4 or Cys3His.'),
	chainId: z.string().nullable(),
	residues: z.array(z.number().int()).describe('Residue numbers of the ligands.'),
	isDemo
});
export type CentreDto = z.infer<typeof centreDtoSchema>;

export const potentialDtoSchema = z.strictObject({
	accession,
	version,
	centre: centreRefSchema,
	protein: proteinRefSchema,
	couple: z.string().describe('The two oxidation levels, e.g. [4Fe-4S]2+/1+.'),
	emMvShe: z.number().describe('Midpoint potential, mV vs SHE (normalised when deposited).'),
	reported: z
		.strictObject({
			value: z.number(),
			unit: z.enum(POTENTIAL_UNITS),
			referenceElectrode: z.enum(REFERENCE_ELECTRODES)
		})
		.describe('The value as the source reported it.'),
	ph: z.number().nullable(),
	temperatureK: z.number().nullable().describe('Temperature, K.'),
	ionicStrengthM: z.number().nullable().describe('Ionic strength, mol/L.'),
	buffer: z.string().nullable(),
	method: z.enum(POTENTIAL_METHODS),
	nElectrons: z.number().describe('Electrons transferred (n).'),
	uncertaintyMv: z.number().nullable().describe('Uncertainty, mV.'),
	source: sourceOrNone,
	isDemo
});
export type PotentialDto = z.infer<typeof potentialDtoSchema>;

export const spinRecordDtoSchema = z.strictObject({
	accession,
	version,
	centre: centreRefSchema,
	protein: proteinRefSchema,
	oxidationLevel: z.string().describe('The oxidation level, e.g. [4Fe-4S]1+.'),
	spinS: z.number().describe('Total spin S.'),
	gValues: z.array(z.number()).describe('EPR g-values, up to three.'),
	temperatureK: z.number().nullable().describe('Temperature of the measurement, K.'),
	method: z.enum(SPIN_METHODS),
	source: sourceOrNone,
	isDemo
});
export type SpinRecordDto = z.infer<typeof spinRecordDtoSchema>;

export const distanceDtoSchema = z.strictObject({
	accession,
	version,
	centreA: centreRefSchema,
	centreB: centreRefSchema,
	protein: proteinRefSchema,
	edgeToEdgeA: z.number().describe('Edge-to-edge distance, Å.'),
	centreToCentreA: z.number().nullable().describe('Centre-to-centre distance, Å.'),
	structureId: z.string().describe('The structure the distance was measured in.'),
	method: z.enum(DISTANCE_METHODS),
	source: sourceOrNone,
	isDemo
});
export type DistanceDto = z.infer<typeof distanceDtoSchema>;

/** What every page of a list says besides its rows. */
export const pageMetaSchema = z.strictObject({
	total: count.describe('Rows matching the query, over all pages.'),
	nextCursor: z
		.string()
		.nullable()
		.describe('Pass back unchanged as `cursor` for the next page; null on the last page.')
});
export type Page<T> = z.infer<typeof pageMetaSchema> & { items: T[] };

/** A page of `item`s as the API's JSON lists send it: the rows, the paging, and the next link. */
export function apiPageSchema<T extends z.ZodType>(item: T) {
	return pageMetaSchema.extend({
		items: z.array(item),
		links: z.strictObject({
			next: z.string().nullable().describe('The URL of the next page; null on the last page.')
		})
	});
}

export const versionSummarySchema = z.strictObject({
	version,
	approvedAt: z.string().describe('When the version was approved (UTC).'),
	changeNote: z.string().nullable()
});
export type VersionSummary = z.infer<typeof versionSummarySchema>;

/** One entry at one version, as the permalink page and the API show it. */
export const entryViewSchema = z.strictObject({
	accession,
	kind: z.enum(ENTRY_KINDS),
	visibility: z.enum(VISIBILITIES),
	isDemo,
	version,
	latestVersion: version.describe('The latest approved version.'),
	approvedAt: z.string().describe('When this version was approved (UTC).'),
	changeNote: z.string().nullable(),
	data: z
		.record(z.string(), z.unknown())
		.describe(
			"The version's data, in its kind's schema; a reference the reader may not see is null."
		),
	versions: z.array(versionSummarySchema).describe('Approved versions, oldest first.'),
	references: z
		.record(z.string(), z.strictObject({ accession, kind: z.enum(ENTRY_KINDS), title: z.string() }))
		.describe(
			'Names of the entries this version refers to, by the field that refers to them, so pages can show links with labels.'
		),
	title: z.string()
});
export type EntryView = z.infer<typeof entryViewSchema>;

/** An entry at a version as GET /api/v1/entries/{accession} sends it: the view and its permalink. */
export const entryAnswerSchema = entryViewSchema.extend({
	permalink: z.string().describe('The versioned permalink (absolute URL): cite this.')
});
export type EntryAnswer = z.infer<typeof entryAnswerSchema>;

export const facetCountSchema = z.strictObject({ value: z.string(), count });
export type FacetCount = z.infer<typeof facetCountSchema>;

export const catalogueFacetsSchema = z.strictObject({
	kinds: z.array(facetCountSchema).describe('Potentials per cofactor kind.'),
	organisms: z.array(facetCountSchema).describe('Potentials per organism.'),
	methods: z.array(facetCountSchema).describe('Potentials per method.'),
	totals: z.strictObject({ proteins: count, centres: count, potentials: count })
});
export type CatalogueFacets = z.infer<typeof catalogueFacetsSchema>;
