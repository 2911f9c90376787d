import type { ParamMatcher } from '@sveltejs/kit';

/**
 * Which file of an attachment a URL serves: the original, an image's preview or thumbnail, or
 * the spectrum's numbers.
 */
export const match = ((param): param is 'original' | 'preview' | 'thumbnail' | 'data' =>
	param === 'original' ||
	param === 'preview' ||
	param === 'thumbnail' ||
	param === 'data') satisfies ParamMatcher;
