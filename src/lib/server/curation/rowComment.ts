/*
 * A curator's comment on one row of a CSV batch, as shown and mailed: "Row 3: …". Curators
 * often begin the comment with the row themselves ("Row 3: check the units", or "row 3 - …");
 * that prefix is not added a second time.
 */
export function withRowPrefix(row: number, body: string): string {
	const own = new RegExp(`^\\s*rows?\\s*${row}\\s*[:.)\\-–]`, 'i');
	return own.test(body) ? body.trim() : `Row ${row}: ${body}`;
}
