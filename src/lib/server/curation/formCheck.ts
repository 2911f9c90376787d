import { createHash } from 'node:crypto';
import type { Kysely } from 'kysely';
import type { EntryData } from '$lib/schemas/entryData';
import type { FieldErrors } from '$lib/schemas/searchParams';
import type { VersionWarning } from '$lib/schemas/versionWarning';
import type { Database } from '../db/schema';
import type { SessionUser } from '../auth/roles';
import { checkEntryReferences } from '../catalogue/references';
import { viewerOf } from '../catalogue/visibility';
import { warningsForVersion } from './checks';

/*
 * The check step of an entry form: before "Submit for review", the contributor sees what a
 * submission would be refused for (references that do not resolve) and the warnings the
 * curators will see beside it — from the same code the submission and review pages use
 * (`warningsForVersion`: typical ranges, conflicts), computed against the values this
 * contributor may see. Nothing is written.
 *
 * The warnings carry a fingerprint (`seen`): the form sends it back as `seenWarnings`, and
 * "Submit for review" sends a version with warnings only when they are the ones last shown;
 * otherwise it shows them first. So no warning reaches the curators unseen by the contributor,
 * with or without JavaScript.
 */
export interface FormCheck {
	warnings: VersionWarning[];
	/** Fingerprint of the warnings shown (not a secret: it only records what was shown). */
	seen: string;
}

export interface FormCheckResult {
	/** Reference errors by field: submitting would be refused for these. */
	errors: FieldErrors;
	check: FormCheck;
}

/** The fingerprint of a list of warnings; the same list always gives the same text. */
export function warningsFingerprint(warnings: readonly VersionWarning[]): string {
	const text = JSON.stringify(
		warnings.map((w) => [w.kind, w.field, w.message, w.source ?? '', w.accession ?? ''])
	);
	return createHash('sha256').update(text).digest('hex').slice(0, 32);
}

/**
 * Checks a form's entry as submitting would.
 * @param entryAccession the entry this version is for, when it has one (a proposed change, an
 *   edited draft): its own approved values are not compared with it.
 */
export async function checkFormEntry(
	db: Kysely<Database>,
	user: SessionUser,
	entry: EntryData,
	entryAccession: string | null
): Promise<FormCheckResult> {
	const viewer = viewerOf(user);
	const errors = await checkEntryReferences(db, entry, viewer);
	let warnings: VersionWarning[] = [];
	if (Object.keys(errors).length === 0) {
		const own = entryAccession
			? await db
					.selectFrom('entry')
					.select('id')
					.where('accession', '=', entryAccession)
					.executeTakeFirst()
			: undefined;
		warnings = await warningsForVersion(db, entry, { entryId: own?.id ?? null, audience: viewer });
	}
	return { errors, check: { warnings, seen: warningsFingerprint(warnings) } };
}

/** Whether "Submit for review" may go ahead: no warnings, or the very ones shown before. */
export function warningsSeen(check: FormCheck, posted: string | undefined): boolean {
	return check.warnings.length === 0 || posted === check.seen;
}
