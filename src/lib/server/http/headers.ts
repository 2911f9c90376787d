/**
 * Sets headers on a response from a handle. Most responses have mutable headers, but one built
 * by `fetch` or `Response.redirect` does not: that one is copied first.
 */
export function withHeaders(response: Response, headers: Record<string, string>): Response {
	try {
		for (const [name, value] of Object.entries(headers)) response.headers.set(name, value);
		return response;
	} catch {
		const copy = new Response(response.body, response);
		for (const [name, value] of Object.entries(headers)) copy.headers.set(name, value);
		return copy;
	}
}
