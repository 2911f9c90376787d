import type { Kysely } from 'kysely';
import { normalisePotential, potentialInputSchema } from '../src/lib/schemas/potential';
import type { EntryKind } from '../src/lib/kinds';
import type { Database } from '../src/lib/server/db/schema';
import { addVersion, approveVersion, createEntry } from '../src/lib/server/catalogue/entries';
import { carryForward, type AttachmentDeps } from '../src/lib/server/attachments/attachments';
import { attachDemoSpectrum } from './demoAttachments';
import { demoSpectrumFiles, type DemoSpectrumFiles } from './spectraFiles';
import {
	DEMO_DISTANCES,
	DEMO_ORGANISM,
	DEMO_POTENTIALS,
	DEMO_PROTEINS,
	DEMO_REVISIONS,
	DEMO_SOURCES,
	DEMO_SPIN_RECORDS
} from './demo';

export interface SeedSummary {
	entries: number;
	proteins: number;
	centres: number;
	potentials: number;
	spinRecords: number;
	distances: number;
	sources: number;
	revisions: number;
	/** Demo spectra stored as attachments (0 when the seed was given no attachment store). */
	attachments: number;
}

export interface DemoLoadOptions {
	/**
	 * Where and how the demo spectra are stored (the app's store and image workers). Left out,
	 * the scenario is loaded without its spectra — as the tests that only need its entries do.
	 */
	attachments?: AttachmentDeps | null;
}

/** True when the catalogue holds no entry at all. */
export async function catalogueIsEmpty(db: Kysely<Database>): Promise<boolean> {
	const row = await db.selectFrom('entry').select('id').limit(1).executeTakeFirst();
	return row === undefined;
}

/**
 * Loads the invented demo scenario through the same services curators use (create entry,
 * submit version, attach its spectra, approve), in one transaction: all of it or none.
 */
export async function loadDemoScenario(
	db: Kysely<Database>,
	options: DemoLoadOptions = {}
): Promise<SeedSummary> {
	const deps = options.attachments ?? null;
	// The PNGs and data files are made before the transaction, so it is not held open for them.
	const spectra = new Map<string, DemoSpectrumFiles[]>();
	if (deps)
		for (const file of await demoSpectrumFiles())
			spectra.set(file.entry, [...(spectra.get(file.entry) ?? []), file]);
	let attached = 0;
	return db.transaction().execute(async (trx) => {
		const { id: submissionId } = await trx
			.insertInto('submission')
			.values({
				channel: 'seed',
				status: 'approved',
				title: 'Demo scenario (invented data)',
				submitted_at: '2024-01-15T12:00:00.000Z'
			})
			.returning('id')
			.executeTakeFirstOrThrow();

		const accessions = new Map<string, string>();
		const entryIds = new Map<string, number>();
		/** The latest version of each entry, whose attachments a revision carries forward. */
		const versionIds = new Map<string, number>();
		const data = new Map<string, Record<string, unknown>>();
		let approvedAt = Date.parse('2024-01-15T12:00:00.000Z');

		async function add(key: string, kind: EntryKind, value: Record<string, unknown>) {
			const entry = await createEntry(trx, { kind, isDemo: true });
			const versionId = await addVersion(trx, entry.id, value, {
				status: 'submitted',
				submissionId,
				changeNote: 'Initial deposit.'
			});
			if (deps)
				for (const file of spectra.get(key) ?? []) {
					await attachDemoSpectrum(trx, deps, entry.id, versionId, file);
					attached += 1;
				}
			versionIds.set(key, versionId);
			approvedAt += 60_000;
			await approveVersion(trx, versionId, { approvedAt: new Date(approvedAt).toISOString() });
			accessions.set(key, entry.accession);
			entryIds.set(key, entry.id);
			data.set(key, value);
		}
		const ref = (key: string): string => {
			const accession = accessions.get(key);
			if (!accession) throw new Error(`demo data refers to unknown key ${key}`);
			return accession;
		};

		for (const s of DEMO_SOURCES) {
			await add(s.key, 'source', {
				sourceKind: 'publication',
				doi: s.doi,
				title: s.title,
				authors: s.authors,
				journal: s.journal,
				year: s.year
			});
		}
		let centres = 0;
		for (const p of DEMO_PROTEINS) {
			await add(p.key, 'protein', {
				name: p.name,
				organism: DEMO_ORGANISM,
				structureIds: p.structureIds,
				description: p.description
			});
			for (const c of p.centres) {
				centres += 1;
				await add(c.key, 'centre', {
					proteinAccession: ref(p.key),
					label: c.label,
					cofactorKind: c.kind,
					ligation: c.ligation,
					chainId: c.chainId,
					residues: c.residues,
					coordinatesA: c.coordinatesA
				});
			}
		}
		for (const p of DEMO_POTENTIALS) {
			const input = potentialInputSchema.parse({
				centreAccession: ref(p.centre),
				couple: p.couple,
				reportedValue: p.value,
				reportedUnit: p.unit,
				referenceElectrode: p.electrode,
				ph: p.ph,
				temperatureK: p.temperatureK,
				ionicStrengthM: p.ionicStrengthM ?? null,
				buffer: p.buffer ?? null,
				method: p.method,
				nElectrons: p.n ?? 1,
				uncertaintyMv: p.uncertaintyMv ?? null,
				sourceAccession: ref(p.source)
			});
			await add(p.key, 'potential', normalisePotential(input));
		}
		for (const [i, s] of DEMO_SPIN_RECORDS.entries()) {
			await add(`spin.${i}`, 'spin_record', {
				centreAccession: ref(s.centre),
				oxidationLevel: s.level,
				spinS: s.spinS,
				gValues: s.g,
				temperatureK: s.temperatureK,
				method: s.method,
				sourceAccession: ref(s.source)
			});
		}
		for (const [i, d] of DEMO_DISTANCES.entries()) {
			await add(`distance.${i}`, 'distance', {
				centreAAccession: ref(d.a),
				centreBAccession: ref(d.b),
				edgeToEdgeA: d.edgeA,
				centreToCentreA: d.centreA,
				structureId: d.structureId,
				method: d.method,
				sourceAccession: ref(d.source)
			});
		}

		for (const r of DEMO_REVISIONS) {
			const previous = data.get(r.entry);
			const entryId = entryIds.get(r.entry);
			if (!previous || entryId === undefined) {
				throw new Error(`demo revision refers to unknown key ${r.entry}`);
			}
			let next: Record<string, unknown> = { ...previous, ...r.changes };
			if (r.entry.startsWith('p.')) {
				const { emMvShe: _stale, ...input } = next;
				next = normalisePotential(potentialInputSchema.parse(input));
			}
			const versionId = await addVersion(trx, entryId, next, {
				status: 'submitted',
				submissionId,
				changeNote: r.note
			});
			// Only with attachments: the migration tests load the scenario into older schemas.
			const base = versionIds.get(r.entry);
			if (deps && base !== undefined) await carryForward(trx, base, versionId);
			versionIds.set(r.entry, versionId);
			await approveVersion(trx, versionId, { approvedAt: r.approvedAt });
			data.set(r.entry, next);
		}

		return {
			entries: accessions.size,
			proteins: DEMO_PROTEINS.length,
			centres,
			potentials: DEMO_POTENTIALS.length,
			spinRecords: DEMO_SPIN_RECORDS.length,
			distances: DEMO_DISTANCES.length,
			sources: DEMO_SOURCES.length,
			revisions: DEMO_REVISIONS.length,
			attachments: attached
		};
	});
}
