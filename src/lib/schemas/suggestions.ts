import { z } from 'zod';
import { queryInteger } from './searchParams';

/*
 * Suggestions for the reference fields of entry forms (a centre, protein or source typed by
 * name, label or accession): the query of GET /api/v1/suggestions and the shape of its answer.
 * Bounded on purpose — a short text, a few words, a few answers — so that each keystroke costs
 * one small indexed or bounded scan.
 */

export const SUGGESTION_TYPES = ['centre', 'protein', 'source'] as const;
export type SuggestionType = (typeof SUGGESTION_TYPES)[number];

export const SUGGESTION_LIMIT_DEFAULT = 8;
export const SUGGESTION_LIMIT_MAX = 20;
export const SUGGESTION_TEXT_MAX = 100;
/** Words of the text matched (each must match); further words are ignored. */
export const SUGGESTION_WORDS_MAX = 4;

export const suggestionQuerySchema = z.strictObject({
	type: z.enum(SUGGESTION_TYPES, {
		error: `expected what to suggest: ${SUGGESTION_TYPES.join(', ')}`
	}),
	q: z
		.string()
		.trim()
		.min(1, 'type at least one character')
		.max(SUGGESTION_TEXT_MAX, `at most ${SUGGESTION_TEXT_MAX} characters`),
	limit: queryInteger(1, SUGGESTION_LIMIT_MAX).default(SUGGESTION_LIMIT_DEFAULT)
});
export type SuggestionQuery = z.infer<typeof suggestionQuerySchema>;

export const suggestionSchema = z.object({
	accession: z.string().describe('The entry’s accession: what the form field takes.'),
	type: z.enum(SUGGESTION_TYPES),
	title: z
		.string()
		.describe('What the entry is called: a centre’s label, a protein’s name, a source’s title.'),
	detail: z
		.string()
		.describe(
			'What tells it apart: a centre’s cofactor type and protein, a protein’s organism, a source’s authors and year.'
		)
});
export type Suggestion = z.infer<typeof suggestionSchema>;

export const suggestionListSchema = z.object({ items: z.array(suggestionSchema) });
export type SuggestionList = z.infer<typeof suggestionListSchema>;

/** The words of a typed text that a suggestion must all match (lower case, at most four). */
export function suggestionWords(text: string): string[] {
	return text
		.toLowerCase()
		.split(/[\s,;]+/)
		.filter((w) => w !== '')
		.slice(0, SUGGESTION_WORDS_MAX);
}
