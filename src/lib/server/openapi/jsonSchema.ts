import { z } from 'zod';

/*
 * zod 4 → JSON Schema (draft 2020-12, the dialect of OpenAPI 3.1), with zod's own converter.
 * Requests are described as a client sends them (`io: 'input'`: a field with a default is
 * optional, coercions read as their target type); answers as the server produces them
 * (`io: 'output'`: every field present, no unknown ones). Refinements (ranges that must be in
 * order, a cursor this API issued) are not expressible and are said in words instead.
 */

export type JsonSchema = { [key: string]: unknown };

const TARGET = 'draft-2020-12';

/** Drops the keys a schema embedded in an OpenAPI document does not carry. */
function embedded(schema: JsonSchema): JsonSchema {
	// eslint-disable-next-line @typescript-eslint/no-unused-vars
	const { $schema, $id, ...rest } = schema;
	return rest;
}

/**
 * zod drops the default of a schema that transforms its input (`io: 'input'`), since a default
 * usually belongs to the output type. The query numbers (`queryNumber`, `queryInteger`: a
 * preprocessing step that reads text, then a number schema) accept their own default as input
 * too, so for them the default is stated again, where zod would have put it.
 */
function keepQueryNumberDefault(ctx: { zodSchema: unknown; jsonSchema: JsonSchema }): void {
	const schema = ctx.zodSchema as z.ZodType;
	if (!(schema instanceof z.ZodDefault) || 'default' in ctx.jsonSchema) return;
	const inner = schema.unwrap();
	if (!(inner instanceof z.ZodPipe) || !(inner.in instanceof z.ZodTransform)) return;
	const value: unknown = schema.def.defaultValue;
	if (!inner.safeParse(value).success) return;
	const rest = { ...ctx.jsonSchema };
	for (const key of Object.keys(rest)) delete ctx.jsonSchema[key];
	Object.assign(ctx.jsonSchema, { default: value }, rest);
}

/** A request's schema (query parameter, path parameter or body), inline. */
export function requestSchema(schema: z.ZodType): JsonSchema {
	return embedded(
		z.toJSONSchema(schema, { target: TARGET, io: 'input', override: keepQueryNumberDefault })
	);
}

/** A stored shape read back (an entry's data): optional where a default fills it in. */
export const storedSchema = requestSchema;

/**
 * Answers' schemas, each under its name, referring to each other by `$ref` into
 * `components/schemas` (a schema used in several answers, such as a protein reference, is
 * written once).
 */
export function componentSchemas(named: Record<string, z.ZodType>): Record<string, JsonSchema> {
	const registry = z.registry<{ id: string }>();
	for (const [id, schema] of Object.entries(named)) {
		if (registry.has(schema)) throw new Error(`schema ${id} is named twice`);
		registry.add(schema, { id });
	}
	const { schemas } = z.toJSONSchema(registry, {
		target: TARGET,
		io: 'output',
		uri: (id) => `#/components/schemas/${id}`
	});
	return Object.fromEntries(
		Object.entries(schemas).map(([id, schema]) => [id, embedded(schema as JsonSchema)])
	);
}
