import type { ParamMatcher } from '@sveltejs/kit';

/** Which file of an attachment a URL serves: the original, or an image's preview or thumbnail. */
export const match = ((param): param is 'original' | 'preview' | 'thumbnail' =>
	param === 'original' || param === 'preview' || param === 'thumbnail') satisfies ParamMatcher;
