import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { entryAttachmentSchema } from '$lib/catalogue/dto';
import { KINDS } from '$lib/kinds';
import {
	carryForward,
	createAttachment,
	listOnVersion,
	unlistFromVersion,
	type AttachmentDeps
} from '$lib/server/attachments/attachments';
import { diskStore } from '$lib/server/attachments/diskStore';
import { closeImagePool, renderImage } from '$lib/server/attachments/imaging';
import {
	apiAttachmentsOfVersion,
	approvedVersionId,
	shownAttachmentsOfVersion
} from '$lib/server/attachments/shownAttachments';
import type { SessionUser } from '$lib/server/auth/roles';
import { addVersion, approveVersion, createEntry } from '$lib/server/catalogue/entries';
import { getEntryView } from '$lib/server/catalogue/entryView';
import { viewerOf } from '$lib/server/catalogue/visibility';
import type { Database } from '$lib/server/db/schema';
import { reviewAttachments } from '../../src/routes/(curation)/review/[id=id]/reviewAttachments';
import { pngOf } from '../support/hostileFiles';
import { createTempDatabase } from '../support/tempDb';
import { insertSessionUser } from '../support/users';

// The entry API's and pages' attachment lists, on a fresh SQLite file migrated by the production
// path, files in a temporary disk store, renditions by the real image worker.

let db: Kysely<Database>;
let remove: () => Promise<void>;
const root = mkdtempSync(join(tmpdir(), 'hopline-entry-attachments-'));
const store = diskStore(root);
const deps: AttachmentDeps = {
	store,
	limits: { maxBytes: 10 * 1024 * 1024, maxPixels: 40_000_000 },
	render: (bytes, photo) => renderImage(bytes, photo)
};
let contributor: SessionUser;
let outsider: SessionUser;
const base = new URL('https://registry.test/api/v1/entries/HL000001');

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	contributor = await insertSessionUser(db, 'contributor', 'c@test.invalid');
	outsider = await insertSessionUser(db, 'reader', 'r@test.invalid');
});
afterAll(async () => {
	await closeImagePool();
	await remove();
	rmSync(root, { recursive: true, force: true });
});

const protein = (name: string) =>
	KINDS.protein.schema.parse({ name, organism: 'Testus attachii', structureIds: ['T1'] });

async function draft(groupId: number | null = null) {
	return db.transaction().execute(async (trx) => {
		const entry = await createEntry(trx, {
			kind: 'protein',
			visibility: groupId === null ? 'public' : 'group',
			groupId,
			createdBy: contributor.id
		});
		const versionId = await addVersion(trx, entry.id, protein(`P ${entry.accession}`), {
			status: 'submitted',
			createdBy: contributor.id
		});
		return { entryId: entry.id, accession: entry.accession, versionId };
	});
}

// An invented EPR derivative line (not a measurement): field in mT, signal in arbitrary units.
const EPR_NUMBERS = [
	'Field (mT), Signal (a.u.)',
	'330,0',
	'335,1',
	'339,0',
	'343,-1',
	'348,0'
].join('\n');

async function eprAttachment(entryId: number, caption: string) {
	return createAttachment(db, deps, {
		entryId,
		role: 'image',
		fileName: 'epr.png',
		bytes: await pngOf(400 + caption.length, 300),
		numbers: { fileName: 'epr.csv', bytes: new TextEncoder().encode(EPR_NUMBERS) },
		meta: {
			kind: 'epr_spectrum',
			caption,
			conditions: { temperatureK: 15, microwaveFrequencyGHz: 9.5, microwavePowerMw: 2 }
		},
		uploadedBy: contributor.id
	});
}

const approve = (versionId: number) =>
	db.transaction().execute((trx) => approveVersion(trx, versionId));

describe('attachments listed with an entry version', () => {
	it('lists a version’s files in the API shape, with absolute URLs, sizes, types and checksums', async () => {
		const p = await draft();
		const a = await eprAttachment(p.entryId, 'X-band, reduced');
		await listOnVersion(db, p.versionId, [a.id]);
		await approve(p.versionId);

		const listed = await apiAttachmentsOfVersion(db, p.accession, 1, base);
		expect(listed).toHaveLength(1);
		const item = entryAttachmentSchema.parse(listed[0]);
		expect(item).toMatchObject({
			id: a.id,
			kind: 'epr_spectrum',
			role: 'image',
			caption: 'X-band, reduced',
			mediaType: 'image/png',
			byteSize: a.byteSize,
			sha256: a.sha256,
			width: 400 + 'X-band, reduced'.length,
			height: 300,
			urls: {
				original: `https://registry.test/files/${a.id}/original`,
				preview: `https://registry.test/files/${a.id}/preview`,
				thumbnail: `https://registry.test/files/${a.id}/thumbnail`,
				data: `https://registry.test/files/${a.id}/data`
			},
			numbers: { fileName: 'epr.csv', byteSize: EPR_NUMBERS.length }
		});
		expect(item.conditions).toMatchObject({
			temperatureK: 15,
			microwaveFrequencyGHz: 9.5,
			microwavePowerMw: 2,
			scanRateMvPerS: null
		});

		// The page's view: conditions with units, and the numbers read back from the store.
		const versionId = await approvedVersionId(db, p.accession, 1);
		const [shown] = await shownAttachmentsOfVersion(db, store, versionId ?? 0);
		expect(shown?.conditions.map((c) => c.text)).toEqual([
			'15\u00a0K',
			'9.5\u00a0GHz',
			'2\u00a0mW'
		]);
		expect(shown?.plot && 'data' in shown.plot ? shown.plot.data.points.length : 0).toBe(5);
	});

	it('freezes v1’s list: a later change that drops one file and adds another leaves v1 as it was', async () => {
		const p = await draft();
		const first = await eprAttachment(p.entryId, 'first spectrum');
		await listOnVersion(db, p.versionId, [first.id]);
		await approve(p.versionId);

		const v2 = await addVersion(db, p.entryId, protein(`P ${p.accession} renamed`), {
			status: 'submitted',
			createdBy: contributor.id
		});
		await carryForward(db, p.versionId, v2);
		const second = await eprAttachment(p.entryId, 'second spectrum');
		await listOnVersion(db, v2, [second.id]);
		await unlistFromVersion(db, v2, first.id);
		// The curator's view of the change: the new file added, the old one dropped.
		const review = (await reviewAttachments(db, store, [v2]))[v2];
		expect(review?.changes).toEqual({ [second.id]: 'added' });
		expect(review?.dropped.map((d) => d.caption)).toEqual(['first spectrum']);
		expect(review?.basedOn).toBe(1);
		await approve(v2);

		const ids = async (version: number) =>
			(await apiAttachmentsOfVersion(db, p.accession, version, base)).map((x) => x.id);
		expect(await ids(1)).toEqual([first.id]);
		expect(await ids(2)).toEqual([second.id]);
		// And the approved list refuses any change.
		await expect(listOnVersion(db, p.versionId, [second.id])).rejects.toThrow(/frozen/);
	});

	it('a group-only entry’s files are not listed to outsiders: the entry itself answers as unknown', async () => {
		const group = await db
			.insertInto('research_group')
			.values({ slug: 'show-g', name: 'Show group' })
			.returning('id')
			.executeTakeFirstOrThrow();
		const p = await draft(group.id);
		const a = await eprAttachment(p.entryId, 'hidden spectrum');
		await listOnVersion(db, p.versionId, [a.id]);
		await approve(p.versionId);

		// The API and the page list attachments only after getEntryView found the entry visible.
		for (const reader of [null, viewerOf(outsider)])
			await expect(getEntryView(db, p.accession, undefined, reader)).rejects.toThrow();
		const member = viewerOf({ ...outsider, groupIds: [group.id] });
		const view = await getEntryView(db, p.accession, undefined, member);
		expect(view.accession).toBe(p.accession);
		expect((await apiAttachmentsOfVersion(db, p.accession, 1, base)).map((x) => x.id)).toEqual([
			a.id
		]);
	});
});
