import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { KINDS } from '$lib/kinds';
import {
	attachmentForReader,
	attachmentsOfVersion,
	carryForward,
	createAttachment,
	listOnVersion,
	removeOrphans,
	unlistFromVersion,
	type AttachmentDeps
} from '$lib/server/attachments/attachments';
import { diskStore } from '$lib/server/attachments/diskStore';
import { AttachmentRejectedError } from '$lib/server/attachments/errors';
import { closeImagePool, renderImage } from '$lib/server/attachments/imaging';
import { serveAttachmentFile } from '$lib/server/attachments/serve';
import type { SessionUser } from '$lib/server/auth/roles';
import { addVersion, approveVersion, createEntry } from '$lib/server/catalogue/entries';
import type { Database } from '$lib/server/db/schema';
import { HTML_PAGE, jpegWithGps, pngOf } from '../support/hostileFiles';
import { createTempDatabase } from '../support/tempDb';
import { insertSessionUser } from '../support/users';

// Rows asserted in a fresh SQLite file migrated by the production path (0013 included); files in
// a temporary disk store; renditions by the real image worker.

let db: Kysely<Database>;
let remove: () => Promise<void>;
const root = mkdtempSync(join(tmpdir(), 'hopline-attachments-'));
const store = diskStore(root);
const deps: AttachmentDeps = {
	store,
	limits: { maxBytes: 10 * 1024 * 1024, maxPixels: 40_000_000 },
	render: (bytes, photo) => renderImage(bytes, photo)
};
let contributor: SessionUser;
let other: SessionUser;
let curator: SessionUser;

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	contributor = await insertSessionUser(db, 'contributor', 'c@test.invalid');
	other = await insertSessionUser(db, 'contributor', 'o@test.invalid');
	curator = await insertSessionUser(db, 'curator', 'k@test.invalid');
});
afterAll(async () => {
	await closeImagePool();
	await remove();
	rmSync(root, { recursive: true, force: true });
});

const protein = (name: string) =>
	KINDS.protein.schema.parse({ name, organism: 'Testus attachii', structureIds: ['T1'] });

async function proteinDraft(visibility: 'public' | 'group', groupId: number | null = null) {
	return db.transaction().execute(async (trx) => {
		const entry = await createEntry(trx, {
			kind: 'protein',
			visibility,
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

const meta = {
	kind: 'epr_spectrum' as const,
	caption: 'X-band EPR, reduced',
	conditions: {
		temperatureK: 15,
		microwaveFrequencyGHz: 9.4,
		microwavePowerMw: 2,
		modulationAmplitudeMt: 1,
		scanRateMvPerS: null,
		referenceElectrode: null
	}
};

describe('attachments as rows and files', () => {
	it('stores original, preview and thumbnail once each, by SHA-256', async () => {
		const p = await proteinDraft('public');
		const bytes = await jpegWithGps(1600, 1200);
		const input = {
			entryId: p.entryId,
			meta,
			fileName: '../../etc/spectrum "1".jpg',
			bytes,
			role: 'image' as const,
			uploadedBy: contributor.id
		};
		const a = await createAttachment(db, deps, input);
		expect(a).toMatchObject({ role: 'image', mediaType: 'image/jpeg', width: 1600, height: 1200 });
		expect(a.fileName).toBe('spectrum 1.jpg');
		expect(a.preview).toMatchObject({ mediaType: 'image/jpeg', width: 1280, height: 960 });
		expect(a.thumbnail).toMatchObject({ width: 320, height: 240 });
		const original = await store.get(a.sha256);
		expect(Buffer.from(original ?? []).equals(Buffer.from(bytes))).toBe(true); // byte for byte

		const again = await createAttachment(db, deps, input);
		expect(again.sha256).toBe(a.sha256);
		const blobs = await db.selectFrom('attachment_blob').select('sha256').execute();
		expect(blobs).toHaveLength(3); // the same content twice is stored once
	});

	it('writes nothing for a refused file', async () => {
		const p = await proteinDraft('public');
		const before = await db.selectFrom('attachment').select('id').execute();
		await expect(
			createAttachment(db, deps, {
				entryId: p.entryId,
				meta,
				fileName: 'x.png',
				bytes: new TextEncoder().encode(HTML_PAGE),
				role: 'image',
				uploadedBy: contributor.id
			})
		).rejects.toBeInstanceOf(AttachmentRejectedError);
		expect(await db.selectFrom('attachment').select('id').execute()).toEqual(before);
	});

	it('a version lists its attachments; approval freezes the list; a change carries it forward', async () => {
		const p = await proteinDraft('public');
		const png = await pngOf(400, 300);
		const a = await createAttachment(db, deps, {
			entryId: p.entryId,
			meta: {
				...meta,
				kind: 'other',
				conditions: {
					...meta.conditions,
					microwaveFrequencyGHz: null,
					microwavePowerMw: null,
					modulationAmplitudeMt: null
				}
			},
			fileName: 'plot.png',
			bytes: png,
			role: 'image',
			uploadedBy: contributor.id
		});
		await listOnVersion(db, p.versionId, [a.id]);
		await db.transaction().execute((trx) => approveVersion(trx, p.versionId));
		expect((await attachmentsOfVersion(db, p.versionId)).map((x) => x.id)).toEqual([a.id]);
		await expect(unlistFromVersion(db, p.versionId, a.id)).rejects.toThrow(/frozen/);
		await expect(listOnVersion(db, p.versionId, [a.id])).rejects.toThrow(/frozen/);

		const change = await db.transaction().execute((trx) =>
			addVersion(trx, p.entryId, protein(`P ${p.accession} renamed`), {
				status: 'draft',
				createdBy: contributor.id
			})
		);
		await carryForward(db, p.versionId, change);
		expect((await attachmentsOfVersion(db, change)).map((x) => x.id)).toEqual([a.id]);
		await unlistFromVersion(db, change, a.id);
		expect(await attachmentsOfVersion(db, change)).toEqual([]);
		expect((await attachmentsOfVersion(db, p.versionId)).map((x) => x.id)).toEqual([a.id]);
	});

	it('a file of a group-only entry is refused to anyone outside the group, the same as a missing one', async () => {
		const group = await db
			.insertInto('research_group')
			.values({ slug: 'att-g', name: 'Attachment group' })
			.returning('id')
			.executeTakeFirstOrThrow();
		const p = await proteinDraft('group', group.id);
		const a = await createAttachment(db, deps, {
			entryId: p.entryId,
			meta: { kind: 'other', caption: 'c', conditions: {} },
			fileName: 'data.csv',
			bytes: new TextEncoder().encode('x,y\n1,2\n3,4\n'),
			role: 'data',
			uploadedBy: contributor.id
		});
		// Before listing: only its uploader.
		expect(await attachmentForReader(db, a.id, contributor)).not.toBeNull();
		expect(await attachmentForReader(db, a.id, other)).toBeNull();
		await listOnVersion(db, p.versionId, [a.id]);
		// Under review: the submitter and curators.
		expect(await attachmentForReader(db, a.id, curator)).not.toBeNull();
		expect(await attachmentForReader(db, a.id, other)).toBeNull();
		await db.transaction().execute((trx) => approveVersion(trx, p.versionId));
		// Approved, group-only: members only; signed out and outsiders get what a missing id gets.
		expect(await attachmentForReader(db, a.id, null)).toBeNull();
		expect(await attachmentForReader(db, a.id, other)).toBeNull();
		expect(await attachmentForReader(db, 999_999, null)).toBeNull();
		expect(await attachmentForReader(db, a.id, { ...other, groupIds: [group.id] })).not.toBeNull();
	});

	it('cleanup removes attachments of rejected submissions and unnamed files, and keeps the rest', async () => {
		const p = await proteinDraft('public');
		const png = await pngOf(50, 40);
		const a = await createAttachment(db, deps, {
			entryId: p.entryId,
			meta: { kind: 'other', caption: 'rejected', conditions: {} },
			fileName: 'r.png',
			bytes: png,
			role: 'image',
			uploadedBy: contributor.id
		});
		await listOnVersion(db, p.versionId, [a.id]);
		await db
			.updateTable('entry_version')
			.set({ status: 'rejected' })
			.where('id', '=', p.versionId)
			.execute();
		const listedElsewhere = await db
			.selectFrom('entry_version_attachment')
			.select('attachment_id')
			.where('attachment_id', '!=', a.id)
			.execute();

		// Within the grace period nothing goes.
		expect((await removeOrphans(db, store)).attachments).toBe(0);
		const later = new Date(Date.now() + 2 * 86_400_000);
		const result = await removeOrphans(db, store, { now: later });
		expect(result.attachments).toBeGreaterThanOrEqual(1);
		expect(await db.selectFrom('attachment').select('id').where('id', '=', a.id).execute()).toEqual(
			[]
		);
		expect(await store.has(a.sha256)).toBe(false);
		expect(await store.has(a.thumbnail?.sha256 ?? '')).toBe(false);
		// Attachments still listed by live versions keep their rows and files.
		for (const l of listedElsewhere) {
			const row = await db
				.selectFrom('attachment')
				.select('original_sha256')
				.where('id', '=', l.attachment_id)
				.executeTakeFirst();
			if (row) expect(await store.has(row.original_sha256)).toBe(true);
		}
		const live = await db.selectFrom('attachment_blob').select('sha256').execute();
		for (const b of live) expect(await store.has(b.sha256)).toBe(true);
	});

	it('serves each file with its detected type, nosniff, a download name, a sandbox policy and immutable caching; hidden alike on every URL', async () => {
		const group = await db
			.insertInto('research_group')
			.values({ slug: 'att-serve', name: 'Serving group' })
			.returning('id')
			.executeTakeFirstOrThrow();
		const p = await proteinDraft('group', group.id);
		const a = await createAttachment(db, deps, {
			entryId: p.entryId,
			meta: { kind: 'other', caption: 'served', conditions: {} },
			fileName: 'plot.png',
			bytes: await pngOf(600, 400),
			role: 'image',
			uploadedBy: contributor.id
		});
		await listOnVersion(db, p.versionId, [a.id]);
		await db.transaction().execute((trx) => approveVersion(trx, p.versionId));
		const member = { ...other, groupIds: [group.id] };

		const original = await serveAttachmentFile(db, store, member, a.id, 'original', null);
		expect(original.status).toBe(200);
		if (original.status !== 200) return;
		expect(original.headers).toMatchObject({
			'content-type': 'image/png',
			'x-content-type-options': 'nosniff',
			'cache-control': 'private, max-age=31536000, immutable',
			etag: `"${a.sha256}"`
		});
		expect(original.headers['content-disposition']).toMatch(/^attachment; filename="plot.png"/);
		expect(original.headers['content-security-policy']).toMatch(/^sandbox;/);
		const thumb = await serveAttachmentFile(db, store, member, a.id, 'thumbnail', null);
		expect(thumb.status === 200 && thumb.headers['content-disposition']).toMatch(
			/plot-thumbnail\.png/
		);
		const again = await serveAttachmentFile(
			db,
			store,
			member,
			a.id,
			'preview',
			`"${a.preview?.sha256}"`
		);
		expect(again.status).toBe(304);

		for (const variant of ['original', 'preview', 'thumbnail'] as const) {
			expect((await serveAttachmentFile(db, store, null, a.id, variant, null)).status).toBe(404);
			expect((await serveAttachmentFile(db, store, other, a.id, variant, null)).status).toBe(404);
		}
		const data = await createAttachment(db, deps, {
			entryId: p.entryId,
			meta: { kind: 'other', caption: 'numbers', conditions: {} },
			fileName: 'numbers.csv',
			bytes: new TextEncoder().encode('x,y\n1,2\n3,4\n'),
			role: 'data',
			uploadedBy: contributor.id
		});
		const served = await serveAttachmentFile(db, store, contributor, data.id, 'original', null);
		expect(served.status === 200 && served.headers['content-disposition']).toMatch(
			/^attachment; filename="numbers.csv"/
		);
		expect(
			(await serveAttachmentFile(db, store, contributor, data.id, 'preview', null)).status
		).toBe(404);
	});
	it('an image carries its numbers: checked for the kind, stored once, served at /data and hidden alike', async () => {
		const p = await proteinDraft('public');
		const bytes = await jpegWithGps(400, 300);
		const field = new TextEncoder().encode('Field (mT),dI/dB\n330,0.1\n331,-0.2\n332,0.05\n');
		const a = await createAttachment(db, deps, {
			entryId: p.entryId,
			meta,
			fileName: 'epr.jpg',
			bytes,
			role: 'image',
			numbers: { fileName: 'epr\u0000.csv', bytes: field },
			uploadedBy: contributor.id
		});
		expect(a.numbers).toMatchObject({ byteSize: field.byteLength, fileName: 'epr.csv' });
		const served = await serveAttachmentFile(db, store, contributor, a.id, 'data', null);
		expect(served.status).toBe(200);
		if (served.status === 200) {
			expect(await new Response(served.body).text()).toBe(new TextDecoder().decode(field));
			expect(served.headers['content-type']).toBe('text/plain; charset=utf-8');
			expect(served.headers['content-disposition']).toMatch(/^attachment; filename="epr.csv"/);
		}
		expect((await serveAttachmentFile(db, store, null, a.id, 'data', null)).status).toBe(404);

		// An EPR spectrum's numbers need a field axis the g scale can be computed from.
		const before = await db.selectFrom('attachment').select('id').execute();
		await expect(
			createAttachment(db, deps, {
				entryId: p.entryId,
				meta,
				fileName: 'epr.jpg',
				bytes,
				role: 'image',
				numbers: {
					fileName: 'volts.csv',
					bytes: new TextEncoder().encode('E (V),i\n0.1,1\n0.2,2\n')
				},
				uploadedBy: contributor.id
			})
		).rejects.toMatchObject({ status: 422, code: 'unreadable_numbers' });
		expect(await db.selectFrom('attachment').select('id').execute()).toEqual(before);
	});
	it('refuses numbers whose header a spreadsheet would run as a formula, and cleans captions', async () => {
		const p = await proteinDraft('public');
		// OWASP, "CSV Injection": cells starting with = + - @ (or tab, CR) are formulas to a spreadsheet.
		for (const header of [
			"=cmd|' /C calc'!A0 (mT),y",
			'Field (mT),@SUM(1+1)',
			'x,+HYPERLINK("http://example.org")'
		]) {
			await expect(
				createAttachment(db, deps, {
					entryId: p.entryId,
					meta: { ...meta, kind: 'other', conditions: {} },
					fileName: 'n.csv',
					bytes: new TextEncoder().encode(`${header}\n1,2\n3,4\n`),
					role: 'data',
					uploadedBy: contributor.id
				})
			).rejects.toMatchObject({ status: 422, code: 'unreadable_numbers' });
		}
		// Negative numbers and a header of names are not formulas.
		const fine = await createAttachment(db, deps, {
			entryId: p.entryId,
			meta: { kind: 'other', caption: 'A\u202egnp.exe \u200bcaption', conditions: {} },
			fileName: 'n.csv',
			bytes: new TextEncoder().encode('-1,-2\n-3,4\n'),
			role: 'data',
			uploadedBy: contributor.id
		});
		expect(fine.caption).toBe('Agnp.exe caption');
	});
});
