/**
 * Lets other requests run between chunks of a long job. Awaiting a resolved promise is not
 * enough (microtasks run before any I/O); setImmediate goes round the event loop.
 */
export const yieldToEventLoop = (): Promise<void> =>
	new Promise<void>((resolve) => setImmediate(resolve));
