import { Ajv2020, type ErrorObject, type ValidateFunction } from 'ajv/dist/2020.js';
import addFormats from 'ajv-formats';

/*
 * Validates values against schemas of an OpenAPI 3.1 document with ajv in the JSON Schema
 * 2020-12 dialect (the document's `jsonSchemaDialect`), an independent validator: `$ref`s into
 * `#/components/schemas` resolve inside the document.
 */

const ROOT = 'urn:hopline:openapi';

interface DocumentWithSchemas {
	components: { schemas: Record<string, unknown> };
}

export interface DocumentValidator {
	/** The errors of `value` against `schema` (a schema of the document, or a `$ref` into it). */
	validate(schema: unknown, value: unknown): { errors: string[] };
}

function describe(e: ErrorObject): string {
	const extra =
		e.keyword === 'additionalProperties' ? ` (${String(e.params.additionalProperty)})` : '';
	return `${e.instancePath || '/'} ${e.message ?? e.keyword}${extra}`;
}

export function documentValidator(doc: DocumentWithSchemas): DocumentValidator {
	const ajv = new Ajv2020({
		allErrors: true,
		strict: true,
		// `if` clauses name properties without repeating `type: object`.
		strictTypes: false,
		formats: { binary: true }
	});
	addFormats(ajv);
	ajv.addVocabulary(['components']);
	ajv.addSchema({ $id: ROOT, components: { schemas: doc.components.schemas } });
	const compiled = new Map<string, ValidateFunction>();
	return {
		validate(schema, value) {
			const key = JSON.stringify(schema);
			let fn = compiled.get(key);
			if (!fn) {
				const local = schema as { $ref?: string };
				fn = ajv.compile(
					typeof local.$ref === 'string' && local.$ref.startsWith('#/')
						? { ...local, $ref: ROOT + local.$ref }
						: local
				);
				compiled.set(key, fn);
			}
			fn(value);
			return { errors: (fn.errors ?? []).map(describe) };
		}
	};
}
