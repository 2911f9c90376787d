import { z } from 'zod';
import { PAGE_SIZES, POTENTIAL_COLUMNS, POTENTIAL_SORTS } from '$lib/catalogue/searchTable';
import { accessionField } from './fields';
import { MAX_CURSOR_LENGTH, decodeCursor } from './pagination';
import { queryInteger, queryNumber } from './searchParams';
import { COFACTOR_KINDS, DISTANCE_METHODS, POTENTIAL_METHODS, SPIN_METHODS } from './vocabulary';

/*
 * Query parameters of the catalogue, shared by the search page (whose whole state lives in the
 * URL) and the read API. One base set of filters; page and API variants add paging and format.
 */

export const LIST_KEYS = ['kind', 'organism', 'method', 'hide'] as const;

const text = z.string().trim().max(200, 'at most 200 characters');
const kinds = z
	.array(
		z.enum(COFACTOR_KINDS, { error: `expected a cofactor kind: ${COFACTOR_KINDS.join(', ')}` })
	)
	.max(COFACTOR_KINDS.length);
const organisms = z.array(text).max(20, 'at most 20 organisms');

const emBound = queryNumber(-2000, 2000, ' mV');
const phBound = queryNumber(0, 14);
const temperatureBound = queryNumber(0, 500, ' K');

function ordered(
	lowKey: string,
	highKey: string
): [(v: Record<string, unknown>) => boolean, { path: string[]; message: string }] {
	return [
		(v) =>
			typeof v[lowKey] !== 'number' ||
			typeof v[highKey] !== 'number' ||
			(v[lowKey] as number) <= (v[highKey] as number),
		{ path: [lowKey], message: `${lowKey} must not exceed ${highKey}` }
	];
}

export const potentialFilterSchema = z.object({
	q: text.optional(),
	kind: kinds.optional(),
	organism: organisms.optional(),
	method: z
		.array(
			z.enum(POTENTIAL_METHODS, { error: `expected a method: ${POTENTIAL_METHODS.join(', ')}` })
		)
		.optional(),
	emMin: emBound.optional(),
	emMax: emBound.optional(),
	phMin: phBound.optional(),
	phMax: phBound.optional(),
	tMin: temperatureBound.optional(),
	tMax: temperatureBound.optional(),
	protein: accessionField.optional(),
	centre: accessionField.optional()
});
export type PotentialFilter = z.infer<typeof potentialFilterSchema>;

const order = z.enum(['asc', 'desc'], { error: 'expected asc or desc' });
const cursor = z
	.string()
	.max(MAX_CURSOR_LENGTH, 'not a cursor issued by this API; pass nextCursor back unchanged')
	.refine(
		(c) => decodeCursor(c) !== null,
		'not a cursor issued by this API; pass nextCursor back unchanged'
	);
const format = z.enum(['json', 'csv'], { error: 'expected json or csv' });

export const API_DEFAULT_LIMIT = 100;
export const API_MAX_LIMIT = 500;
const limit = queryInteger(1, API_MAX_LIMIT);

function withOrderedBounds<T extends z.ZodObject>(schema: T) {
	return schema
		.refine(...ordered('emMin', 'emMax'))
		.refine(...ordered('phMin', 'phMax'))
		.refine(...ordered('tMin', 'tMax'));
}

export const potentialApiQuerySchema = potentialFilterSchema.extend({
	sort: z
		.enum(POTENTIAL_SORTS, { error: `expected one of ${POTENTIAL_SORTS.join(', ')}` })
		.optional(),
	order: order.optional(),
	limit: limit.default(API_DEFAULT_LIMIT),
	cursor: cursor.optional(),
	format: format.default('json')
});
export const potentialApiQuery = withOrderedBounds(potentialApiQuerySchema);
export type PotentialApiQuery = z.infer<typeof potentialApiQuerySchema>;

/** The facet counts of a search: its filters only (counts are within what they match). */
export const facetsApiQuery = withOrderedBounds(potentialFilterSchema);

/** Every matching row as CSV (the search page's export): the filters and the order only. */
export const potentialExportQuerySchema = potentialFilterSchema.extend({
	sort: potentialApiQuerySchema.shape.sort,
	order: order.optional()
});
export const potentialExportQuery = withOrderedBounds(potentialExportQuerySchema);

export const potentialPageQuerySchema = potentialFilterSchema.extend({
	sort: z
		.enum(POTENTIAL_SORTS, { error: `expected one of ${POTENTIAL_SORTS.join(', ')}` })
		.optional(),
	order: order.optional(),
	/** A cursor from the API (the page's Previous / Next links). */
	cursor: cursor.optional(),
	/** Page numbers of links made before cursors (read as an offset; no longer produced). */
	page: queryInteger(1, 100_000).default(1),
	size: z.coerce
		.number()
		.refine(
			(n) => (PAGE_SIZES as readonly number[]).includes(n),
			`expected one of ${PAGE_SIZES.join(', ')}`
		)
		.default(25),
	hide: z
		.array(
			z.enum([...POTENTIAL_COLUMNS, 'none'], {
				error: `expected column names: ${POTENTIAL_COLUMNS.join(', ')} (or none)`
			})
		)
		.optional()
});
export const potentialPageQuery = withOrderedBounds(potentialPageQuerySchema);
export type PotentialPageQuery = z.infer<typeof potentialPageQuerySchema>;

const paging = {
	limit: limit.default(API_DEFAULT_LIMIT),
	cursor: cursor.optional(),
	format: format.default('json'),
	order: order.optional()
};

export const PROTEIN_SORTS = ['accession', 'name', 'organism'] as const;
export const proteinApiQuerySchema = z.object({
	q: text.optional(),
	organism: organisms.optional(),
	sort: z.enum(PROTEIN_SORTS, { error: `expected one of ${PROTEIN_SORTS.join(', ')}` }).optional(),
	...paging
});
export type ProteinApiQuery = z.infer<typeof proteinApiQuerySchema>;

export const CENTRE_SORTS = ['accession', 'protein', 'label', 'kind'] as const;
export const centreApiQuerySchema = z.object({
	q: text.optional(),
	kind: kinds.optional(),
	organism: organisms.optional(),
	protein: accessionField.optional(),
	sort: z.enum(CENTRE_SORTS, { error: `expected one of ${CENTRE_SORTS.join(', ')}` }).optional(),
	...paging
});
export type CentreApiQuery = z.infer<typeof centreApiQuerySchema>;

export const SPIN_SORTS = ['accession', 'centre', 'spin', 'temperature'] as const;
export const spinRecordApiQuerySchema = z.object({
	kind: kinds.optional(),
	organism: organisms.optional(),
	protein: accessionField.optional(),
	centre: accessionField.optional(),
	method: z
		.array(z.enum(SPIN_METHODS, { error: `expected a method: ${SPIN_METHODS.join(', ')}` }))
		.optional(),
	spin: queryNumber(0, 5).optional(),
	sort: z.enum(SPIN_SORTS, { error: `expected one of ${SPIN_SORTS.join(', ')}` }).optional(),
	...paging
});
export type SpinRecordApiQuery = z.infer<typeof spinRecordApiQuerySchema>;

export const DISTANCE_SORTS = ['accession', 'edge', 'centre'] as const;
export const distanceApiQuerySchema = z.object({
	organism: organisms.optional(),
	protein: accessionField.optional(),
	centre: accessionField.optional(),
	method: z
		.array(z.enum(DISTANCE_METHODS, { error: `expected a method: ${DISTANCE_METHODS.join(', ')}` }))
		.optional(),
	edgeMin: queryNumber(0, 100, ' Å').optional(),
	edgeMax: queryNumber(0, 100, ' Å').optional(),
	sort: z
		.enum(DISTANCE_SORTS, { error: `expected one of ${DISTANCE_SORTS.join(', ')}` })
		.optional(),
	...paging
});
export const distanceApiQuery = distanceApiQuerySchema.refine(...ordered('edgeMin', 'edgeMax'));
export type DistanceApiQuery = z.infer<typeof distanceApiQuerySchema>;

export const entryApiQuerySchema = z.object({
	version: queryInteger(1, 999_999).optional()
});
