import type { CodeSample } from './codeSamples';
import type { JsonSchema } from './jsonSchema';

/*
 * The parts of OpenAPI 3.1 this document uses, typed as the document writes them (the whole
 * specification's types would admit far more than is ever built or read here).
 */

export interface OpenApiRef {
	$ref: string;
}

export interface OpenApiParameter {
	name: string;
	in: 'path' | 'query';
	required: boolean;
	description: string;
	schema: JsonSchema;
	style?: 'form';
	explode?: boolean;
	example?: unknown;
}

export interface OpenApiMedia {
	schema: JsonSchema;
	example?: unknown;
	encoding?: Record<string, { contentType: string }>;
}

export interface OpenApiResponse {
	description: string;
	headers?: Record<string, { description: string; schema: JsonSchema }>;
	content?: Record<string, OpenApiMedia>;
}

/** Scheme name → scopes (OpenAPI 3.1 allows role names for schemes other than OAuth). */
export type SecurityRequirement = Record<string, string[]>;

export interface OpenApiOperation {
	operationId: string;
	tags: string[];
	summary: string;
	description: string;
	security: SecurityRequirement[];
	parameters?: OpenApiParameter[];
	requestBody?: { required: true; description: string; content: Record<string, OpenApiMedia> };
	responses: Record<string, OpenApiResponse | OpenApiRef>;
	'x-codeSamples': CodeSample[];
}

export type HttpMethod = 'get' | 'post' | 'delete';

export type SecurityScheme =
	| { type: 'http'; scheme: 'bearer'; description: string }
	| { type: 'apiKey'; in: 'cookie'; name: string; description: string };

export interface OpenApiDocument {
	openapi: '3.1.0';
	jsonSchemaDialect: string;
	info: { title: string; version: string; summary: string; description: string };
	servers: { url: string; description: string }[];
	externalDocs: { url: string; description: string };
	tags: { name: string; description: string }[];
	security: SecurityRequirement[];
	paths: Record<string, Partial<Record<HttpMethod, OpenApiOperation>>>;
	components: {
		schemas: Record<string, JsonSchema>;
		responses: Record<string, OpenApiResponse>;
		securitySchemes: Record<string, SecurityScheme>;
	};
}
