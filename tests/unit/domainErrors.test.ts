import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { isActionFailure, isHttpError } from '@sveltejs/kit';
import { describe, expect, it, vi } from 'vitest';
import { CsvLimitError } from '$lib/catalogue/csvRecords';
import { DomainError } from '$lib/domainError';
import { fieldErrors } from '$lib/schemas/fieldErrors';
import { parseVisibilityRequest, visibilityFromForm } from '$lib/schemas/submission';
import { AdminRuleError } from '$lib/server/admin/accounts';
import { AccessRequestError } from '$lib/server/admin/accessRequests';
import { apiHandler } from '$lib/server/api/handler';
import {
	ApiTokenInputError,
	ApiTokenLimitError,
	ApiTokenNotFoundError,
	ApiTokenRateLimitError,
	ApiTokenRefusedError,
	ApiTokenScopeError
} from '$lib/server/auth/apiTokenErrors';
import { BusyError } from '$lib/server/auth/hashingQueue';
import { ForbiddenError, UnauthenticatedError } from '$lib/server/auth/roles';
import {
	CalcBusyError,
	CalcInputError,
	CalcRateLimitedError,
	CalcTimeLimitError
} from '$lib/server/calc/errors';
import {
	CursorMismatchError,
	EntryNotFoundError,
	ExportBusyError,
	ExportTooLargeError,
	InvalidEntryDataError,
	VersionStateError
} from '$lib/server/catalogue/errors';
import {
	PendingLimitError,
	SubmissionAccessError,
	SubmissionInvalidError,
	SubmissionNotFoundError,
	SubmissionStateError
} from '$lib/server/curation/errors';
import { AccessDateError } from '$lib/server/citations/files';
import { orNotFound, toApiResponse, toFormFailure } from '$lib/server/http/failures';
import { UploadHasErrorsError } from '$lib/server/uploads/commitUpload';
import { StructureFileError } from '$lib/server/structures/readStructureFile';
import { StructureBusyError } from '$lib/server/structures/flow';
import {
	AttachmentFileError,
	AttachmentNotFoundError
} from '$lib/server/attachments/submissionAttachments';
import { z } from 'zod';

/**
 * Every domain failure and the answer it must get. The oracle for each status is what the API
 * documents: the codes in src/lib/schemas/apiError.ts and DEVELOPERS.md ("Calculations off the
 * request thread": 429, 503, 422; "CSV uploads": 413 beside the file field; "Curation": 409 for
 * the pending-rows limit), and each class's own doc comment. The statuses are written out here
 * rather than read from API_ERROR_CODES, so a changed code fails this test.
 */
interface Case {
	error: DomainError;
	status: number;
	code: string;
	fields?: Record<string, string[]>;
	retryAfter?: string;
}
const CASES: Record<string, Case> = {
	AccessDateError: {
		error: new AccessDateError('2001-01-01 is not today anywhere'),
		status: 400,
		code: 'bad_request',
		fields: { accessed: ['2001-01-01 is not today anywhere'] }
	},
	EntryNotFoundError: { error: new EntryNotFoundError('HL000001'), status: 404, code: 'not_found' },
	InvalidEntryDataError: {
		error: new InvalidEntryDataError('centreAccession', 'no centre HL000002'),
		status: 400,
		code: 'bad_request',
		fields: { centreAccession: ['centreAccession: no centre HL000002'] }
	},
	VersionStateError: {
		error: new VersionStateError('version 3 is approved, not submitted'),
		status: 409,
		code: 'conflict'
	},
	CursorMismatchError: {
		error: new CursorMismatchError('this cursor belongs to the proteins list, not centres'),
		status: 400,
		code: 'bad_request',
		fields: { cursor: ['this cursor belongs to the proteins list, not centres'] }
	},
	ExportTooLargeError: {
		error: new ExportTooLargeError(250_000, 200_000),
		status: 400,
		code: 'bad_request'
	},
	ExportBusyError: {
		error: new ExportBusyError(10),
		status: 503,
		code: 'unavailable',
		retryAfter: '10'
	},
	SubmissionNotFoundError: {
		error: new SubmissionNotFoundError(7),
		status: 404,
		code: 'not_found'
	},
	SubmissionStateError: {
		error: new SubmissionStateError('the submission is approved already'),
		status: 409,
		code: 'conflict'
	},
	SubmissionAccessError: {
		error: new SubmissionAccessError('nobody decides on their own submission'),
		status: 403,
		code: 'forbidden'
	},
	SubmissionInvalidError: {
		error: new SubmissionInvalidError({ ph: ['expected a number'] }),
		status: 400,
		code: 'bad_request',
		fields: { ph: ['expected a number'] }
	},
	PendingLimitError: { error: new PendingLimitError(10, 5, 12), status: 409, code: 'conflict' },
	AccessRequestError: {
		error: new AccessRequestError('too_many_requests', 'you asked 2 hours ago', 79_200),
		status: 429,
		code: 'too_many_requests',
		retryAfter: '79200'
	},
	CalcBusyError: {
		error: new CalcBusyError(7),
		status: 503,
		code: 'unavailable',
		retryAfter: '7'
	},
	CalcRateLimitedError: {
		error: new CalcRateLimitedError(42, 30),
		status: 429,
		code: 'too_many_requests',
		retryAfter: '42'
	},
	CalcTimeLimitError: {
		error: new CalcTimeLimitError(10_000),
		status: 422,
		code: 'time_limit_exceeded'
	},
	CalcInputError: {
		error: new CalcInputError('points', 'the signal does not change'),
		status: 400,
		code: 'bad_request',
		fields: { points: ['the signal does not change'] }
	},
	UnauthenticatedError: { error: new UnauthenticatedError(), status: 401, code: 'unauthorized' },
	ForbiddenError: { error: new ForbiddenError('curator'), status: 403, code: 'forbidden' },
	AdminRuleError: {
		error: new AdminRuleError('role', 'the last active admin keeps the admin role'),
		status: 400,
		code: 'bad_request',
		fields: { role: ['the last active admin keeps the admin role'] }
	},
	BusyError: { error: new BusyError(), status: 503, code: 'unavailable' },
	// Personal API tokens (DEVELOPERS.md, "API tokens"): 401 for a token that lets nobody in, 403
	// for a scope too narrow, 429 past the per-token limit, 400/409/404 on /account.
	ApiTokenRefusedError: {
		error: new ApiTokenRefusedError('revoked'),
		status: 401,
		code: 'unauthorized'
	},
	ApiTokenScopeError: {
		error: new ApiTokenScopeError('read', 'read+submit'),
		status: 403,
		code: 'forbidden'
	},
	ApiTokenRateLimitError: {
		error: new ApiTokenRateLimitError(12, 600, 60),
		status: 429,
		code: 'too_many_requests',
		retryAfter: '12'
	},
	ApiTokenInputError: {
		error: new ApiTokenInputError({ scope: ['submitting needs the contributor role'] }),
		status: 400,
		code: 'bad_request',
		fields: { scope: ['submitting needs the contributor role'] }
	},
	ApiTokenLimitError: { error: new ApiTokenLimitError(50), status: 409, code: 'conflict' },
	ApiTokenNotFoundError: { error: new ApiTokenNotFoundError(7), status: 404, code: 'not_found' },
	UploadHasErrorsError: { error: new UploadHasErrorsError(3), status: 400, code: 'bad_request' },
	StructureFileError: {
		error: new StructureFileError('the structure file is empty'),
		status: 400,
		code: 'bad_request'
	},
	StructureBusyError: {
		error: new StructureBusyError(),
		status: 503,
		code: 'unavailable',
		retryAfter: '5'
	},
	// DEVELOPERS.md, "Attachments": a refused file beside its field, with the inspector's status.
	AttachmentFileError: {
		error: new AttachmentFileError('file', 'active_content', 415, 'SVG images are not accepted.'),
		status: 415,
		code: 'unsupported_media_type',
		fields: { file: ['SVG images are not accepted.'] }
	},
	AttachmentNotFoundError: {
		error: new AttachmentNotFoundError(31, 57),
		status: 404,
		code: 'not_found'
	},
	CsvLimitError: {
		error: new CsvLimitError('columns', 200, 1, 'Row 1 has more than 200 columns'),
		status: 413,
		code: 'payload_too_large',
		fields: { file: ['Row 1 has more than 200 columns'] }
	}
};

/** Every class in src that extends DomainError, directly or through another subclass. */
function domainErrorClassesInSource(): string[] {
	const parents = new Map<string, string>();
	const walk = (dir: string) => {
		for (const name of readdirSync(dir)) {
			const path = join(dir, name);
			if (statSync(path).isDirectory()) walk(path);
			else if (/\.(ts|svelte)$/.test(name)) {
				for (const m of readFileSync(path, 'utf8').matchAll(/class (\w+) extends (\w+)/g)) {
					parents.set(m[1]!, m[2]!);
				}
			}
		}
	};
	walk('src');
	const isDomain = (name: string): boolean => {
		const parent = parents.get(name);
		return parent === 'DomainError' || (parent !== undefined && isDomain(parent));
	};
	return [...parents.keys()].filter(isDomain).sort();
}

const recordHeaders = () => {
	const headers: Record<string, string> = {};
	return { headers, setHeaders: (h: Record<string, string>) => Object.assign(headers, h) };
};

describe('domain errors', () => {
	it('lists every DomainError subclass in src (a new one needs a row here)', () => {
		expect(domainErrorClassesInSource()).toEqual(Object.keys(CASES).sort());
	});

	for (const [name, c] of Object.entries(CASES)) {
		it(`${name} answers the API with ${c.status} ${c.code}`, async () => {
			expect(c.error).toBeInstanceOf(DomainError);
			expect(c.error.name).toBe(name);
			const response = toApiResponse(c.error);
			expect(response.status).toBe(c.status);
			expect(await response.json()).toEqual({
				error: { code: c.code, message: c.error.message, ...(c.fields ? { fields: c.fields } : {}) }
			});
			expect(response.headers.get('retry-after')).toBe(c.retryAfter ?? null);
		});

		it(`${name} answers a form action with ${c.status}`, () => {
			const event = recordHeaders();
			const values = { name: 'typed' };
			let answer: unknown;
			try {
				answer = toFormFailure(c.error, event, values);
			} catch (thrown) {
				answer = thrown;
			}
			if (c.status === 401 || c.status === 403 || c.status === 404) {
				// The page itself is closed: a SvelteKit error, not an answer beside the form.
				expect(isHttpError(answer, c.status)).toBe(true);
				expect((answer as { body: { message: string } }).body).toEqual({
					message: c.error.message
				});
				return;
			}
			expect(isActionFailure(answer)).toBe(true);
			const failure = answer as { status: number; data: unknown };
			expect(failure.status).toBe(c.status);
			expect(failure.data).toEqual({
				values,
				errors:
					// A refused file (415, or 422 unreadable) is shown beside its field as well.
					c.status === 400 ||
					c.status === 413 ||
					c.code === 'unsupported_media_type' ||
					c.code === 'unprocessable_content'
						? (c.fields ?? { form: [c.error.message] })
						: { form: [c.error.message] }
			});
			expect(event.headers['retry-after']).toBe(c.retryAfter);
		});
	}
});

describe('toFormFailure', () => {
	it('leaves values out when the action keeps none', () => {
		const answer = toFormFailure(new BusyError(), recordHeaders());
		expect(answer.status).toBe(503);
		expect(answer.data).toEqual({ errors: { form: [new BusyError().message] } });
	});

	it('re-throws what is not a domain error, unchanged', () => {
		const bug = new TypeError('undefined is not a function');
		expect(() => toFormFailure(bug, recordHeaders(), {})).toThrow(bug);
	});
});

describe('apiHandler', () => {
	const event = {
		request: new Request('http://hopline.test/api/v1/x', { method: 'POST' }),
		url: new URL('http://hopline.test/api/v1/x')
	} as Parameters<ReturnType<typeof apiHandler>>[0];

	it('answers a domain error by its code', async () => {
		const handler = apiHandler(async () => {
			throw new SubmissionStateError('the submission is withdrawn');
		});
		const response = await handler(event);
		expect(response.status).toBe(409);
		expect(await response.json()).toEqual({
			error: { code: 'conflict', message: 'the submission is withdrawn' }
		});
	});

	it('answers anything else with a logged 500 that names an error id only', async () => {
		const log = vi.spyOn(console, 'error').mockImplementation(() => {});
		const handler = apiHandler(async () => {
			throw new Error('SQLITE_CORRUPT: secret detail');
		});
		const response = await handler(event);
		const body = (await response.json()) as { error: { code: string; errorId: string } };
		expect(response.status).toBe(500);
		expect(body.error.code).toBe('internal_error');
		expect(JSON.stringify(body)).not.toContain('secret');
		expect(log).toHaveBeenCalledOnce();
		expect(String(log.mock.calls[0]?.[0])).toContain(body.error.errorId);
		log.mockRestore();
	});
});

describe('orNotFound', () => {
	it('gives the value of work that succeeds', async () => {
		expect(await orNotFound(Promise.resolve(3), 'unused')).toBe(3);
	});
	it("turns a not-found domain error into a 404 with the page's own message", async () => {
		const answer = await orNotFound(
			Promise.reject(new EntryNotFoundError('HL000009')),
			'There is no entry HL000009.'
		).catch((e: unknown) => e);
		expect(isHttpError(answer, 404)).toBe(true);
		expect((answer as { body: unknown }).body).toEqual({ message: 'There is no entry HL000009.' });
	});
	it('lets other failures pass unchanged', async () => {
		const other = new SubmissionAccessError('not yours');
		await expect(orNotFound(Promise.reject(other), 'unused')).rejects.toBe(other);
	});
});

describe('fieldErrors', () => {
	const schema = z.object({ a: z.number(), nested: z.object({ b: z.string() }) });
	it('keys issues by dotted path, with a prefix and a key for the whole value', () => {
		const error = schema.safeParse({ a: 'x', nested: { b: 1 } }).error!;
		expect(Object.keys(fieldErrors(error))).toEqual(['a', 'nested.b']);
		expect(Object.keys(fieldErrors(error, { prefix: 'data.' }))).toEqual([
			'data.a',
			'data.nested.b'
		]);
		const whole = z.string().min(1, 'write a comment').safeParse('').error!;
		expect(fieldErrors(whole)).toEqual({ _: ['write a comment'] });
		expect(fieldErrors(whole, { root: 'body' })).toEqual({ body: ['write a comment'] });
	});
});

describe('reading a requested visibility', () => {
	it('reads empty form fields as public with no group or date', () => {
		expect(visibilityFromForm({ visibility: '', groupId: '', embargoUntil: '' })).toEqual({
			ok: true,
			visibility: { visibility: 'public', groupId: null, embargoUntil: null }
		});
	});
	it('names the missing group beside its field, prefixed for the API', () => {
		expect(visibilityFromForm({ visibility: 'group' })).toEqual({
			ok: false,
			fields: { groupId: ['choose the group that may see it'] }
		});
		expect(parseVisibilityRequest({ visibility: 'group' }, 'visibility.')).toEqual({
			ok: false,
			fields: { 'visibility.groupId': ['choose the group that may see it'] }
		});
	});
});
