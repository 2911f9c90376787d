/*
 * JSON held in a TEXT column. The column's type says what the text holds; `readJson` is the
 * one place the text becomes that value, so no caller writes `JSON.parse(…) as T` of its own.
 * Read-model columns are written from data the zod schemas have checked, so their JSON is
 * trusted on reading; a version's data is checked again by parseEntryData.
 */
import type { ColumnType } from 'kysely';

declare const holds: unique symbol;

/** Text of JSON that encodes a T. */
export type JsonText<T> = string & { readonly [holds]: T };

/** A TEXT column holding JSON of a T: read as JsonText<T>, written as text. */
export type JsonColumn<T> = ColumnType<JsonText<T>, string, string>;

export function readJson<T>(text: JsonText<T>): T {
	return JSON.parse(text) as T;
}
