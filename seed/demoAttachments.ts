import type { Kysely } from 'kysely';
import type { Database } from '../src/lib/server/db/schema';
import {
	createAttachment,
	listOnVersion,
	type AttachmentDeps
} from '../src/lib/server/attachments/attachments';
import { renderImage } from '../src/lib/server/attachments/imaging';
import { attachmentStore } from '../src/lib/server/attachments/store';
import { config } from '../src/lib/server/config';
import type { DemoSpectrumFiles } from './spectraFiles';

/** The app's attachment store, limits and image workers, for the demo's spectra. */
export function appAttachmentDeps(): AttachmentDeps {
	return {
		store: attachmentStore(),
		limits: { maxBytes: config.ATTACHMENT_MAX_BYTES, maxPixels: config.ATTACHMENT_MAX_PIXELS },
		render: (bytes, photo) => renderImage(bytes, photo)
	};
}

/*
 * The demo's spectra stored as attachments of the entries they were computed from (an EPR
 * spectrum on its spin record, a voltammogram on its potential), through the same service an
 * upload uses: checked, rendered in the image workers, stored by SHA-256, listed on the version
 * before it is approved (an approved version's list never changes). Every caption says
 * "demo data, computed".
 */

/** Stores one demo spectrum (its PNG with its numbers file) and lists it on the version. */
export async function attachDemoSpectrum(
	trx: Kysely<Database>,
	deps: AttachmentDeps,
	entryId: number,
	versionId: number,
	file: DemoSpectrumFiles
): Promise<void> {
	const attachment = await createAttachment(trx, deps, {
		entryId,
		role: 'image',
		fileName: file.png.fileName,
		bytes: file.png.bytes,
		numbers: { fileName: file.data.fileName, bytes: new TextEncoder().encode(file.data.text) },
		meta: {
			kind: file.kind === 'epr' ? 'epr_spectrum' : 'voltammogram',
			caption: file.caption,
			conditions: {
				temperatureK: file.temperatureK,
				microwaveFrequencyGHz: file.frequencyGHz ?? null,
				scanRateMvPerS: file.scanRateMvPerS ?? null,
				referenceElectrode: file.electrode ?? null
			}
		},
		uploadedBy: null
	});
	await listOnVersion(trx, versionId, [attachment.id]);
}
