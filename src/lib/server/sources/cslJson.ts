import { z } from 'zod';

/*
 * The part of a CSL-JSON item (Citation Style Language, citationstyles.org, schema
 * csl-data.json) that a source needs: title, authors, container title, year, DOI. DOI
 * registration agencies answer content negotiation for `application/vnd.citationstyles.csl+json`
 * with it.
 */
const textOrList = z
	.union([z.string(), z.array(z.string())])
	.transform((v) => (Array.isArray(v) ? (v[0] ?? '') : v).replace(/\s+/g, ' ').trim());

const person = z.object({
	family: z.string().optional(),
	given: z.string().optional(),
	literal: z.string().optional()
});

export const cslItemSchema = z.object({
	DOI: z.string().optional(),
	title: textOrList,
	author: z.array(person).default([]),
	'container-title': textOrList.optional(),
	issued: z
		.object({ 'date-parts': z.array(z.array(z.union([z.number(), z.string()]))).optional() })
		.optional()
});

export interface DoiMetadata {
	doi: string;
	title: string;
	/** "Family, Given" per author, as sources store them. */
	authors: string[];
	journal: string | null;
	year: number | null;
}

export function metadataFromCsl(doi: string, item: z.infer<typeof cslItemSchema>): DoiMetadata {
	const year = Number(item.issued?.['date-parts']?.[0]?.[0]);
	return {
		doi: item.DOI ?? doi,
		title: item.title,
		authors: item.author
			.map((a) => a.literal ?? [a.family, a.given].filter(Boolean).join(', '))
			.filter((name) => name.length > 0),
		journal: item['container-title'] || null,
		year: Number.isInteger(year) ? year : null
	};
}

/** CSL-JSON for metadata: what the loopback fake serves, in the shape real agencies use. */
export function cslFromMetadata(m: DoiMetadata) {
	return {
		type: 'article-journal',
		DOI: m.doi,
		title: m.title,
		author: m.authors.map((name) => {
			const [family, given] = name.split(',').map((s) => s.trim());
			return { family, given };
		}),
		'container-title': m.journal ?? undefined,
		issued: m.year ? { 'date-parts': [[m.year]] } : undefined
	};
}
