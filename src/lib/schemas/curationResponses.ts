import { z } from 'zod';
import { ENTRY_KINDS, UPLOAD_KINDS } from '$lib/kinds';
import { ROLES } from '$lib/roles';
import { ACCESSION_PATTERN } from './accession';
import { attachmentAnswerSchema } from './attachmentResponse';
import { REVIEW_DECISIONS, SUBMISSION_STATES } from './submission';
import { versionWarningSchema } from './versionWarning';
import { VISIBILITIES } from './vocabulary';

/*
 * What the contributor endpoints answer: a submission as its contributor or a curator reads it
 * (the API and the submission and review pages share it), the answer to a new submission, and
 * the summary of a CSV check. The services are typed with these, and the OpenAPI document
 * describes the answers with the same schemas.
 */

const accession = z.string().regex(ACCESSION_PATTERN);
const id = z.number().int().min(1);
const timestamp = z.string().describe('UTC time, as stored.');
const entryData = z.record(z.string(), z.unknown());

export const fieldChangeSchema = z.strictObject({
	field: z.string(),
	before: z.unknown(),
	after: z.unknown()
});

export const versionViewSchema = z.strictObject({
	versionId: id,
	entryId: id,
	accession,
	kind: z.enum(ENTRY_KINDS),
	status: z.string().describe('The version’s state: draft, submitted, returned, approved, …'),
	data: entryData.describe('The proposed data, in its kind’s stored schema.'),
	changeNote: z.string().nullable(),
	requestedVisibility: z
		.strictObject({
			visibility: z.enum(VISIBILITIES),
			groupName: z.string().nullable(),
			groupId: id.nullable(),
			embargoUntil: z.string().nullable()
		})
		.nullable(),
	current: z
		.strictObject({ version: id, data: entryData })
		.nullable()
		.describe('The approved version this one would replace; null for a new entry.'),
	changes: z.array(fieldChangeSchema).describe('Fields that differ from the current version.'),
	staleBase: z
		.strictObject({ basedOn: id.nullable(), latest: id })
		.nullable()
		.describe(
			'The approved version the proposal started from, when a newer one has been approved since.'
		),
	warnings: z.array(versionWarningSchema),
	approvedVersion: id.nullable()
});
export type VersionView = z.infer<typeof versionViewSchema>;

export const submissionViewSchema = z.strictObject({
	submission: z.strictObject({
		id,
		title: z.string(),
		status: z.enum(SUBMISSION_STATES),
		channel: z.enum(['form', 'csv', 'seed']),
		isOwn: z.boolean().describe('Whether the reader is its contributor.'),
		contributor: z.string(),
		contributorEmail: z.string().nullable(),
		createdAt: timestamp,
		submittedAt: timestamp.nullable(),
		updatedAt: timestamp
	}),
	versions: z
		.array(versionViewSchema)
		.describe('The versions of a form submission; empty for a CSV batch (read it on its page).'),
	comments: z.array(
		z.strictObject({
			id,
			body: z.string(),
			at: timestamp,
			author: z.string(),
			role: z.enum(ROLES)
		})
	),
	reviews: z.array(
		z.strictObject({
			id,
			decision: z.enum(REVIEW_DECISIONS),
			comment: z.string().nullable(),
			at: timestamp,
			reviewer: z.string().nullable()
		})
	)
});
export type SubmissionView = z.infer<typeof submissionViewSchema>;

/**
 * A submission as the API answers it: each version with the files it carries, in order (a
 * proposed change starts with its base version's). The attachments are added at the boundary
 * (attachments/submissionAttachments.ts), above curation in the import layers.
 */
export const submissionWithFilesSchema = submissionViewSchema.extend({
	versions: z
		.array(
			versionViewSchema.extend({
				attachments: z
					.array(attachmentAnswerSchema)
					.describe('The files this version carries, in order.')
			})
		)
		.describe('The versions of a form submission; empty for a CSV batch (read it on its page).')
});
export type SubmissionWithFiles = z.infer<typeof submissionWithFilesSchema>;

export const submissionCreatedSchema = z.strictObject({
	id,
	accession: accession.describe('The new entry’s accession, or the entry being changed.'),
	status: z.enum(SUBMISSION_STATES).describe('draft, or submitted when `submit` was true.'),
	warnings: z.array(versionWarningSchema).describe('Range and conflict warnings; never refusals.'),
	links: z.strictObject({
		self: z.string().describe('This submission in the API.'),
		page: z.string().describe('This submission on the site.')
	})
});
export type SubmissionCreated = z.infer<typeof submissionCreatedSchema>;

const count = z.number().int().min(0);

export const uploadIssueSchema = z.strictObject({
	row: z.number().int().min(1).describe('Row as a spreadsheet numbers it: the header is row 1.'),
	column: z.string(),
	value: z.string(),
	message: z.string(),
	severity: z.enum(['error', 'warning'])
});
export type UploadIssue = z.infer<typeof uploadIssueSchema>;

export const uploadCheckSummarySchema = z.strictObject({
	kind: z.enum(UPLOAD_KINDS),
	sha256: z.string().describe('SHA-256 of the file, hex.'),
	byteSize: count,
	delimiter: z.string().describe('The delimiter found: , ; or tab.'),
	rowCount: count,
	columns: z
		.array(z.strictObject({ header: z.string(), column: z.string().nullable() }))
		.describe('Each header as written and the column it was read as (null: not recognised).'),
	errorCount: count,
	warningCount: count,
	wouldCreate: z.strictObject({ entries: count, proteins: count }),
	previousUpload: z
		.strictObject({ submissionId: id, status: z.string(), createdAt: timestamp })
		.nullable()
		.describe('The same file sent before, if it was.'),
	issues: z.array(uploadIssueSchema),
	moreIssues: count.describe('Issues beyond those listed.'),
	preview: z.strictObject({
		fields: z.array(z.string()),
		rows: z.array(
			z.strictObject({ row: z.number().int(), warnings: count, cells: z.array(z.string()) })
		)
	})
});
export type CheckSummary = z.infer<typeof uploadCheckSummarySchema>;
