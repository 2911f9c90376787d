import { browser } from '$app/environment';
import type { Reroute } from '@sveltejs/kit';
import { isDocumentPath, NO_CLIENT_ROUTE } from '$lib/documentPages';

/**
 * In the browser only: the client-side router does not take the document pages (the entry
 * pages, `csr = false`). Left alone, it would render one in the browser when a hydrated page
 * links to it (SvelteKit does so whatever the target's `csr`), preload its data on hover, and
 * leave out the page's own script; told that no route matches, it lets the browser load the page.
 * The server routes every path as it is.
 */
export const reroute: Reroute = ({ url }) => {
	if (browser && isDocumentPath(url.pathname)) return NO_CLIENT_ROUTE;
};
