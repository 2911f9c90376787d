import type { Handle } from '@sveltejs/kit';
import { withHeaders } from './headers';

/*
 * Says which character set HTML answers are in. SvelteKit sends pages as plain `text/html`;
 * browsers then sniff the <meta charset> of the first bytes, but crawlers, reference managers'
 * page importers and HTTP libraries read the header, and without a charset some fall back to
 * ISO-8859-1 and turn "Å", "–" and "⁺" into mojibake.
 */
export const htmlCharset: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	const type = response.headers.get('content-type');
	if (!type || !/^text\/html\s*(;|$)/i.test(type) || /;\s*charset=/i.test(type)) return response;
	return withHeaders(response, {
		'content-type': `${type.replace(/\s*;?\s*$/, '')}; charset=utf-8`
	});
};
