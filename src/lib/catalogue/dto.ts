import { z } from 'zod';
import { attachmentAnswerSchema, type AttachmentAnswer } from '$lib/schemas/attachmentResponse';
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
	// The stored version's fields are edgeToEdgeA / centreToCentreA (DEVELOPERS.md, "Public names").
	edgeToEdgeAngstrom: z.number().describe('Edge-to-edge distance, Å.'),
	centreToCentreAngstrom: z.number().nullable().describe('Centre-to-centre distance, Å.'),
	structureId: z.string().describe('The structure the distance was measured in.'),
	method: z.enum(DISTANCE_METHODS),
	source: sourceOrNone,
	isDemo
});
export type DistanceDto = z.infer<typeof distanceDtoSchema>;

/**
 * What every page of a list says besides its rows. `offset` is the position of its first row
 * among all `total` matches as the list stood when the page was read; the cursors lead to the
 * rows right after and right before it (null at either end).
 */
export const pageMetaSchema = z.strictObject({
	total: count.describe('Rows matching the query, over all pages.'),
	offset: count.describe("The position of the page's first row among the matches, from 0."),
	nextCursor: z
		.string()
		.nullable()
		.describe('Pass back unchanged as `cursor` for the next page; null on the last page.'),
	prevCursor: z
		.string()
		.nullable()
		.describe('Pass back unchanged as `cursor` for the page before; null on the first page.')
});
export type Page<T> = z.infer<typeof pageMetaSchema> & { items: T[] };

/** A page of `item`s as the API's JSON lists send it: the rows, the paging, and the next link. */
export function apiPageSchema<T extends z.ZodType>(item: T) {
	return pageMetaSchema.extend({
		items: z.array(item),
		links: z.strictObject({
			next: z.string().nullable().describe('The URL of the next page; null on the last page.'),
			prev: z.string().nullable().describe('The URL of the page before; null on the first page.')
		})
	});
}

export const versionSummarySchema = z.strictObject({
	version,
	approvedAt: z.string().describe('When the version was approved (UTC).'),
	changeNote: z.string().nullable()
});
export type VersionSummary = z.infer<typeof versionSummarySchema>;

/**
 * An entry a version names, pinned to the version of it that was approved when the naming
 * version was (entry_version_reference, migration 0009).
 */
export const pinnedReferenceSchema = z.strictObject({
	accession,
	kind: z.enum(ENTRY_KINDS),
	version: version.describe("The referenced entry's version this version was approved against."),
	title: z
		.string()
		.describe('The title of that version, from its data and its own pinned references.')
});
export type PinnedReference = z.infer<typeof pinnedReferenceSchema>;

const frozenMembers = {
	accession,
	kind: z.enum(ENTRY_KINDS),
	isDemo,
	version,
	approvedAt: z.string().describe('When this version was approved (UTC).'),
	changeNote: z.string().nullable(),
	data: z
		.record(z.string(), z.unknown())
		.describe(
			"The version's data, in its kind's schema; a reference the reader may not see is null."
		),
	title: z
		.string()
		.describe("From the version's own data and its pinned references, never from later versions.")
};

/**
 * One approved version as it was approved: none of this changes after approval, whatever is
 * approved later (a reference the reader may not see is left out: its field reads null).
 */
export const frozenVersionSchema = z.strictObject({
	...frozenMembers,
	references: z
		.record(z.string(), pinnedReferenceSchema)
		.describe('The entries this version names, by field, at their pinned versions.')
});
export type FrozenVersion = z.infer<typeof frozenVersionSchema>;

/** What is true of an entry now rather than of one version: it changes with later approvals. */
export const entryLiveStateSchema = z.strictObject({
	latestVersion: version.describe('The latest approved version.'),
	versions: z
		.array(versionSummarySchema)
		.describe('The newest approved versions (at most 100), oldest first.'),
	visibility: z.enum(VISIBILITIES),
	newerReferences: z
		.record(z.string(), version)
		.describe(
			"For references whose entry has a newer approved version than the pinned one: that entry's latest version, by field."
		)
});
export type EntryLiveState = z.infer<typeof entryLiveStateSchema>;

/** One entry at one version, as the permalink page shows it: the frozen version, and now. */
export const entryViewSchema = frozenVersionSchema.extend({ live: entryLiveStateSchema });
export type EntryView = z.infer<typeof entryViewSchema>;

const permalinkUrl = z.string().describe('The versioned permalink (absolute URL): cite this.');
/** A pinned reference with the absolute permalink of the version it is pinned to. */
export const linkedReferenceSchema = pinnedReferenceSchema.extend({ permalink: permalinkUrl });
export type LinkedReference = z.infer<typeof linkedReferenceSchema>;

/**
 * A file listed by a version (an EPR spectrum, a voltammogram …, its numbers, a structure file):
 * part of the frozen version, in the version's order. One schema with the submission API's.
 */
export const entryAttachmentSchema = attachmentAnswerSchema;
export type EntryAttachment = AttachmentAnswer;

/**
 * An entry at a version as GET /api/v1/entries/{accession} sends it: the frozen version with
 * absolute permalinks; `live` only when no version was asked for, `latest` when one was (so a
 * versioned answer never changes).
 */
export const entryAnswerSchema = z.strictObject({
	...frozenMembers,
	references: z
		.record(z.string(), linkedReferenceSchema)
		.describe('The entries this version names, by field, at their pinned versions.'),
	permalink: permalinkUrl,
	attachments: z
		.array(entryAttachmentSchema)
		.describe(
			'The files this version lists (spectra, their numbers, structure files), in order; frozen with the version.'
		),
	latest: z
		.string()
		.optional()
		.describe('With ?version=N: where the entry as it is now is answered.'),
	live: entryLiveStateSchema
		.optional()
		.describe('Without ?version: what is true of the entry now (changes with later approvals).')
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
