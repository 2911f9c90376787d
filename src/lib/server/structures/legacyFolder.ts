import { createHash } from 'node:crypto';
import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { sql, type Kysely } from 'kysely';
import type { Database } from '../db/schema';
import { readJson } from '../db/json';
import { listOnVersion } from '../attachments/attachments';
import type { BlobStore } from '../attachments/storage';
import { distanceCaption, keepStructureFile } from './structureFile';

/*
 * Structure files kept before they were attachments: `<data folder>/structures/<SHA-256>`, named
 * by each distance's note ("… (SHA-256 <hex>)"). Moving them (scripts/structures-migrate.ts):
 *
 * - a distance version still open (draft or submitted) whose note names the file gets it as its
 *   attachment, listed, exactly as the structure flow does today;
 * - an approved version is frozen (its attachment list never changes), so a file named only by
 *   approved (or closed) versions is left where it is: the note still records its checksum;
 * - nothing is deleted: the report says which files the folder still holds, for the operator.
 */
const SHA256 = /^[0-9a-f]{64}$/;

export interface LegacyReport {
	/** Files read from the folder (named by a SHA-256 their bytes match). */
	files: number;
	/** Open versions that now list their file. */
	listed: number;
	/** Files no open version names: left in the folder. */
	leftInFolder: string[];
	/** Names in the folder that are not a SHA-256 of their bytes: skipped. */
	skipped: string[];
}

export async function moveLegacyStructureFiles(
	db: Kysely<Database>,
	store: BlobStore,
	folder: string
): Promise<LegacyReport> {
	const report: LegacyReport = { files: 0, listed: 0, leftInFolder: [], skipped: [] };
	let names: string[];
	try {
		names = await readdir(folder);
	} catch (e) {
		if ((e as { code?: string }).code === 'ENOENT') return report;
		throw e;
	}
	for (const name of names.sort()) {
		if (!SHA256.test(name)) {
			report.skipped.push(name);
			continue;
		}
		const bytes = await readFile(join(folder, name));
		if (createHash('sha256').update(bytes).digest('hex') !== name) {
			report.skipped.push(name);
			continue;
		}
		report.files++;
		const open = await db
			.selectFrom('entry_version as v')
			.innerJoin('entry as e', 'e.id', 'v.entry_id')
			.select(['v.id', 'v.entry_id', 'v.data', 'v.created_by'])
			.where('e.kind', '=', 'distance')
			.where('v.status', 'in', ['draft', 'submitted'])
			.where('v.created_by', 'is not', null)
			.where(sql<boolean>`v.data like ${`%SHA-256 ${name}%`}`)
			// Run twice, it lists nothing twice.
			.where(({ not, exists, selectFrom }) =>
				not(
					exists(
						selectFrom('entry_version_attachment as l')
							.innerJoin('attachment as a', 'a.id', 'l.attachment_id')
							.select('l.attachment_id')
							.whereRef('l.entry_version_id', '=', 'v.id')
							.where('a.original_sha256', '=', name)
					)
				)
			)
			.execute();
		let listedHere = 0;
		for (const v of open) {
			const data = readJson<{ note?: string | null; structureId?: string }>(v.data);
			const note = data.note ?? '';
			const fileName = /uploaded structure file (.+) \(SHA-256 /.exec(note)?.[1] ?? 'structure';
			const kept = await keepStructureFile(
				db,
				{
					entryId: v.entry_id,
					bytes,
					fileName,
					uploadedBy: v.created_by as string,
					caption: distanceCaption(data.structureId ?? 'file')
				},
				store
			);
			await listOnVersion(db, v.id, [kept.attachmentId]);
			listedHere++;
		}
		report.listed += listedHere;
		if (listedHere === 0) report.leftInFolder.push(name);
	}
	return report;
}
