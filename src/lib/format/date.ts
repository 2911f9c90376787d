/** A stored ISO timestamp as its day, "2026-12-03": the date columns of lists. */
export function formatDate(iso: string): string {
	return iso.slice(0, 10);
}
