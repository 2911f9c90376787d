import type { Generated, Selectable } from 'kysely';

/**
 * The one description of the SQLite schema as Kysely sees it (see migrations/ for the DDL).
 * Row types elsewhere derive from this with Selectable<…>; never write a parallel row type.
 * Auth.js's four tables keep the names and camelCase columns its adapter requires.
 */
/** A row of one table as Kysely reads it (what a query selecting its columns returns). */
export type Row<T extends keyof Database> = Selectable<Database[T]>;

/**
 * The read-model tables of the entry kinds, one each, named by the kind: each kind's server
 * module (src/lib/server/kinds/<kind>.ts) declares its own here, beside the code that writes
 * and reads it, so that a new kind adds its table without editing this file.
 */
// eslint-disable-next-line @typescript-eslint/no-empty-object-type -- filled by declaration merging
export interface KindTables {}

export interface Database extends KindTables {
	User: UserTable;
	Account: AccountTable;
	Session: SessionTable;
	VerificationToken: VerificationTokenTable;
	revoked_session: RevokedSessionTable;
	research_group: ResearchGroupTable;
	group_member: GroupMemberTable;
	entry_kind: EntryKindTable;
	entry: EntryTable;
	entry_version: EntryVersionTable;
	entry_version_reference: EntryVersionReferenceTable;
	submission: SubmissionTable;
	review: ReviewTable;
	submission_comment: SubmissionCommentTable;
	attachment_blob: AttachmentBlobTable;
	attachment: AttachmentTable;
	entry_version_attachment: EntryVersionAttachmentTable;
	calculation: CalculationTable;
	calculation_input: CalculationInputTable;
	release: ReleaseTable;
	release_entry: ReleaseEntryTable;
	audit_log: AuditLogTable;
	access_request: AccessRequestTable;
	curation_notice: CurationNoticeTable;
	saved_search: SavedSearchTable;
	api_token: ApiTokenTable;
	catalogue_state: CatalogueStateTable;
	backup_log: BackupLogTable;
	user_credit_history: UserCreditHistoryTable;
}

export type { Role } from '$lib/roles';
import type { Role } from '$lib/roles';
import type { Visibility } from '$lib/schemas/vocabulary';
import type { ApiTokenScope } from '$lib/schemas/apiTokenScopes';
import type { EntryKind } from '$lib/kinds';
import type { JsonColumn } from './json';
import type { AttachmentKind } from '$lib/schemas/attachment';

export type { Visibility } from '$lib/schemas/vocabulary';
export type { EntryKind } from '$lib/kinds';
export type VersionStatus =
	'draft' | 'submitted' | 'returned' | 'approved' | 'rejected' | 'withdrawn';
export type SubmissionStatus =
	'draft' | 'submitted' | 'returned' | 'approved' | 'partially_approved' | 'rejected' | 'withdrawn';

export interface UserTable {
	id: Generated<string>;
	name: string | null;
	email: string | null;
	emailVerified: string | null;
	image: string | null;
	role: Generated<Role>;
	passwordHash: string | null;
	createdAt: Generated<string>;
	disabledAt: string | null;
	/** How a curator hears of new submissions: a mail each, one daily digest, or none. */
	curationNotices: Generated<CurationNotices>;
	lastDigestAt: string | null;
	/** Raised to end every session of the user; each session cookie carries the one it began under. */
	sessionGeneration: Generated<number>;
	/** The person's ORCID iD (canonical hyphenated form), named in citations (migration 0010). */
	orcid: string | null;
}

/** A signed-out session, refused until its cookie would have expired anyway. */
export interface RevokedSessionTable {
	id: string;
	user_id: string;
	expires_at: string;
}

export type CurationNotices = 'immediate' | 'daily' | 'off';

export interface CurationNoticeTable {
	id: Generated<number>;
	user_id: string;
	submission_id: number;
	created_at: Generated<string>;
	sent_at: string | null;
}

export interface AccountTable {
	id: Generated<string>;
	userId: string;
	type: string;
	provider: string;
	providerAccountId: string;
	refresh_token: string | null;
	access_token: string | null;
	expires_at: number | null;
	token_type: string | null;
	scope: string | null;
	id_token: string | null;
	session_state: string | null;
}

export interface SessionTable {
	id: Generated<string>;
	userId: string;
	sessionToken: string;
	expires: string;
}

export interface VerificationTokenTable {
	identifier: string;
	token: string;
	expires: string;
}

export interface ResearchGroupTable {
	id: Generated<number>;
	slug: string;
	name: string;
	created_at: Generated<string>;
}

export interface GroupMemberTable {
	group_id: number;
	user_id: string;
	is_manager: Generated<number>;
	joined_at: Generated<string>;
}

/** The kinds of entry (migration 0008): each kind's migration inserts its row. */
export interface EntryKindTable {
	id: EntryKind;
}

export interface EntryTable {
	id: Generated<number>;
	accession: string;
	kind: EntryKind;
	visibility: Generated<Visibility>;
	group_id: number | null;
	embargo_until: string | null;
	is_demo: Generated<number>;
	created_by: string | null;
	created_at: Generated<string>;
	merged_into_entry_id: number | null;
}

export interface EntryVersionTable {
	id: Generated<number>;
	entry_id: number;
	version: number | null;
	status: VersionStatus;
	/** JSON of the entity's stored schema (src/lib/schemas), validated on write and read. */
	data: JsonColumn<Record<string, unknown>>;
	change_note: string | null;
	submission_id: number | null;
	based_on_version: number | null;
	created_by: string | null;
	created_at: Generated<string>;
	approved_by: string | null;
	approved_at: string | null;
	/** The visibility this version asks for, applied to its entry on approval; null keeps it. */
	visibility: Visibility | null;
	group_id: number | null;
	embargo_until: string | null;
	/**
	 * For a CSV batch: the file row, and the warnings found on checking (JSON `VersionWarning[]`,
	 * migration 0006; read with `parseStoredWarnings`).
	 */
	row_number: number | null;
	warnings: string | null;
}

/**
 * The exact version each reference field of an approved version resolved to when it was
 * approved (migration 0009; written by catalogue/projection.ts, never changed or deleted).
 */
export interface EntryVersionReferenceTable {
	entry_version_id: number;
	/** The reference field of the kind (src/lib/kinds), e.g. `proteinAccession`. */
	field: string;
	referenced_entry_id: number;
	referenced_version: number;
}

export interface SubmissionTable {
	id: Generated<number>;
	channel: 'form' | 'csv' | 'seed';
	status: Generated<SubmissionStatus>;
	title: string;
	submitted_by: string | null;
	content_sha256: string | null;
	row_count: number | null;
	created_at: Generated<string>;
	updated_at: Generated<string>;
	submitted_at: string | null;
}

export interface ReviewTable {
	id: Generated<number>;
	submission_id: number;
	reviewer_id: string;
	decision: 'approve' | 'return' | 'reject';
	comment: string | null;
	created_at: Generated<string>;
}

export interface SubmissionCommentTable {
	id: Generated<number>;
	submission_id: number;
	entry_version_id: number | null;
	author_id: string;
	body: string;
	created_at: Generated<string>;
}

/** A stored file, keyed by the SHA-256 of its bytes (migration 0013; src/lib/server/attachments). */
export interface AttachmentBlobTable {
	sha256: string;
	media_type: string;
	byte_size: number;
	width: number | null;
	height: number | null;
	created_at: Generated<string>;
}

/** One attached file as described by its contributor; never changed once written (migration 0013). */
export interface AttachmentTable {
	id: Generated<number>;
	entry_id: number;
	kind: AttachmentKind;
	role: 'image' | 'data' | 'structure';
	/** JSON of the acquisition conditions (src/lib/schemas/attachment.ts). */
	conditions: JsonColumn<Record<string, unknown>>;
	caption: string;
	file_name: string;
	original_sha256: string;
	preview_sha256: string | null;
	thumb_sha256: string | null;
	/** An image's companion numbers file (migration 0014), or null. */
	data_sha256: string | null;
	data_file_name: string | null;
	uploaded_by: string | null;
	created_at: Generated<string>;
}

/** The attachments a version lists, in order; frozen with the version at approval. */
export interface EntryVersionAttachmentTable {
	entry_version_id: number;
	attachment_id: number;
	position: number;
}

export interface CalculationTable {
	id: Generated<number>;
	slug: string;
	kind: string;
	title: string;
	inputs: string;
	result: string;
	engine_version: string;
	visibility: Generated<'public' | 'group' | 'private'>;
	created_by: string | null;
	created_at: Generated<string>;
}

export interface CalculationInputTable {
	calculation_id: number;
	entry_version_id: number;
}

export interface ReleaseTable {
	id: Generated<number>;
	number: number;
	title: string;
	notes: string | null;
	entry_count: number;
	manifest_sha256: string;
	created_by: string | null;
	created_at: Generated<string>;
}

export interface ReleaseEntryTable {
	release_id: number;
	entry_version_id: number;
}

export interface AuditLogTable {
	id: Generated<number>;
	at: Generated<string>;
	actor_id: string | null;
	action: string;
	entry_id: number | null;
	submission_id: number | null;
	before: string | null;
	after: string | null;
	detail: string | null;
}

/** A reader's request for contributor access (migration 0012): one open request per user. */
export interface AccessRequestTable {
	id: Generated<number>;
	user_id: string;
	role: 'contributor';
	message: string | null;
	status: 'open' | 'granted' | 'dismissed';
	created_at: Generated<string>;
	closed_at: string | null;
	closed_by: string | null;
}

export interface SavedSearchTable {
	id: Generated<number>;
	user_id: string;
	name: string;
	query: string;
	created_at: Generated<string>;
}

/** A personal API token (auth/apiTokens.ts): only its SHA-256 is stored. Scope and expiry: 0011. */
export interface ApiTokenTable {
	id: Generated<number>;
	user_id: string;
	name: string;
	token_sha256: string;
	created_at: Generated<string>;
	/** Written at most once a minute per token, so that reading with a token is not a write. */
	last_used_at: string | null;
	revoked_at: string | null;
	scope: Generated<ApiTokenScope>;
	/** The instant from which the token is refused; null: it does not expire. */
	expires_at: string | null;
}

export interface CatalogueStateTable {
	id: number;
	revision: number;
}

/** A backup taken or restored from the command line (migration 0005; see db/backup.ts). */
export interface BackupLogTable {
	id: Generated<number>;
	kind: 'backup' | 'restore';
	at: Generated<string>;
	/** The backup file written, or restored from (absolute path on the server). */
	file: string;
	bytes: number;
	sha256: string;
	table_count: number;
	row_count: number;
	last_migration: string | null;
	seconds: number;
}

/**
 * Every name and ORCID iD a person has had, from when (migration 0010: triggers on `User` add a
 * row on each change; rows are never changed). Citations name people as they were when the
 * version was approved (catalogue/credit.ts).
 */
export interface UserCreditHistoryTable {
	id: Generated<number>;
	user_id: string;
	name: string | null;
	orcid: string | null;
	/** ISO 8601, comparable with entry_version.approved_at. */
	changed_at: string;
}

export type EntryRow = Selectable<EntryTable>;
export type EntryVersionRow = Selectable<EntryVersionTable>;
export type SubmissionRow = Selectable<SubmissionTable>;
