import type { Kysely } from 'kysely';
import Papa from 'papaparse';
import type { StructureReading } from '$lib/science';
import type { CofactorKind, DistanceMethod } from '$lib/schemas/vocabulary';
import { warningText } from '$lib/catalogue/warningText';
import { readJson } from '../db/json';
import type { Database } from '../db/schema';
import { entryIsVisible, type Viewer } from '../catalogue/visibility';
import { uploadCsvLimits } from '../uploads/readCsv';
import { checkUpload, type UploadCheck } from '../uploads/checkUpload';
import { calculate } from '../calc/compute';

/*
 * Distances proposed from an uploaded structure: its cofactor groups, the match of groups to the
 * protein's centres (proposed, then confirmed by the contributor), and the pairs within the
 * cutoff written as one distance batch that goes through the CSV check — so duplicates of and
 * conflicts with approved distances are found by the same rules as for a CSV file, and the
 * commit is the same all-or-nothing submission.
 */

export interface ProteinForStructure {
	accession: string;
	entryId: number;
	name: string;
	structureIds: string[];
	centres: {
		accession: string;
		label: string;
		cofactorKind: CofactorKind;
		chainId: string | null;
		residues: number[];
	}[];
	/** Approved distances between the protein's visible centres (both ends visible). */
	distances: ExistingDistance[];
}

export interface ExistingDistance {
	accession: string;
	centreA: string;
	centreB: string;
	edgeToEdgeA: number;
	centreToCentreA: number | null;
	structureId: string;
}

/** The protein and its centres that the viewer may see; null when the protein is not visible. */
export async function loadProteinForStructure(
	db: Kysely<Database>,
	accession: string,
	viewer: Viewer | null
): Promise<ProteinForStructure | null> {
	const protein = await db
		.selectFrom('protein')
		.innerJoin('entry', 'entry.id', 'protein.entry_id')
		.select(['entry.accession', 'protein.entry_id', 'protein.name', 'protein.structure_ids'])
		.where('entry.accession', '=', accession)
		.where((eb) => entryIsVisible(eb, 'entry', viewer))
		.executeTakeFirst();
	if (!protein) return null;
	const centres = await db
		.selectFrom('centre')
		.innerJoin('entry', 'entry.id', 'centre.entry_id')
		.select([
			'entry.accession',
			'centre.label',
			'centre.cofactor_kind',
			'centre.chain_id',
			'centre.residues'
		])
		.where('centre.protein_entry_id', '=', protein.entry_id)
		.where((eb) => entryIsVisible(eb, 'entry', viewer))
		.orderBy('centre.label')
		.execute();
	const visibleCentres = new Map(centres.map((c) => [c.accession, c]));
	const distances = centres.length
		? await db
				.selectFrom('distance as d')
				.innerJoin('entry as e', 'e.id', 'd.entry_id')
				.innerJoin('entry as ae', 'ae.id', 'd.centre_a_entry_id')
				.innerJoin('entry as be', 'be.id', 'd.centre_b_entry_id')
				.innerJoin('centre as a', 'a.entry_id', 'd.centre_a_entry_id')
				.select([
					'e.accession',
					'ae.accession as a',
					'be.accession as b',
					'd.edge_to_edge_a',
					'd.centre_to_centre_a',
					'd.structure_id'
				])
				.where('a.protein_entry_id', '=', protein.entry_id)
				.where((eb) => entryIsVisible(eb, 'e', viewer))
				.orderBy('e.accession')
				.execute()
		: [];
	return {
		distances: distances
			// Both centres must be visible: a hidden centre is never named, not even by a distance.
			.filter((d) => visibleCentres.has(d.a) && visibleCentres.has(d.b))
			.map((d) => ({
				accession: d.accession,
				centreA: d.a,
				centreB: d.b,
				edgeToEdgeA: d.edge_to_edge_a,
				centreToCentreA: d.centre_to_centre_a,
				structureId: d.structure_id
			})),
		accession: protein.accession,
		entryId: protein.entry_id,
		name: protein.name,
		structureIds: readJson(protein.structure_ids),
		centres: centres.map((c) => ({
			accession: c.accession,
			label: c.label,
			cofactorKind: c.cofactor_kind,
			chainId: c.chain_id,
			residues: readJson(c.residues)
		}))
	};
}

export interface ProposedDistance {
	/** "i-j", the two groups' indexes: the value of the tick box. */
	key: string;
	centreA: { accession: string; label: string; group: string };
	centreB: { accession: string; label: string; group: string };
	edgeToEdgeA: number;
	atoms: string;
	centreToCentreA: number;
	/**
	 * The batch check's warnings other than "already recorded" for a distance listed in
	 * `existing`: that one is said once, on its line there.
	 */
	warnings: string[];
	errors: string[];
	/** Approved distances of the same pair (any structure), shown beside the new one. */
	existing: (ExistingDistance & { sameStructure: boolean; conflict: boolean })[];
	/**
	 * Ticked when the page shows the plan: not when it has errors, nor when the pair is already
	 * recorded for the same structure (a conflict or a repeat) — the contributor may tick it.
	 */
	preselected: boolean;
}

/** A difference in edge-to-edge distance above which the same pair and structure conflict, Å. */
export const CONFLICT_A = 0.2;

export interface DistancePlan {
	proposed: ProposedDistance[];
	check: UploadCheck;
	/** Row of the generated batch → the proposed distance's key. */
	keyOfRow: Map<number, string>;
}

const round2 = (x: number) => Math.round(x * 100) / 100;

/**
 * The distances between matched centres within the cutoff, checked as a distance batch.
 * `matches[i]` is the centre accession confirmed for group i ('' for none), already validated
 * against the protein's visible centres; `only` keeps the ticked keys (all when null).
 */
export async function planDistances(
	db: Kysely<Database>,
	input: {
		reading: StructureReading;
		protein: ProteinForStructure;
		matches: string[];
		structureId: string;
		method: DistanceMethod;
		cutoffA: number;
		sha256: string;
		filename: string;
		only: Set<string> | null;
		viewer: Viewer;
		uploaderId: string;
	}
): Promise<DistancePlan> {
	const { reading, protein } = input;
	const matchedIndexes = input.matches.flatMap((m, i) => (m ? [i] : []));
	const matchedGroups = matchedIndexes.map((i) => reading.groups[i]!);
	const centreByAccession = new Map(protein.centres.map((c) => [c.accession, c]));
	// The geometry (every heavy atom of a group against every one of the other, for each pair)
	// runs in the calculation pool, like the reading, never on the request thread.
	const found = await calculate(
		{ kind: 'structurePairs', groups: matchedGroups, cutoffA: input.cutoffA },
		null
	);
	const pairs = found.map((p) => ({
		...p,
		a: matchedIndexes[p.a]!,
		b: matchedIndexes[p.b]!
	}));
	const kept = pairs.filter((p) => !input.only || input.only.has(`${p.a}-${p.b}`));
	const rows = kept.map((p) => {
		const edge = p.edge;
		return {
			centreAAccession: input.matches[p.a]!,
			centreBAccession: input.matches[p.b]!,
			edgeToEdgeA: round2(edge.distanceA).toFixed(2),
			centreToCentreA: round2(p.centreToCentreA).toFixed(2),
			structureId: input.structureId,
			method: input.method,
			note:
				`Measured in the uploaded structure file ${input.filename} (SHA-256 ${input.sha256}). ` +
				`Edge-to-edge between ${edge.atomA.group} ${edge.atomA.name} and ${edge.atomB.group} ${edge.atomB.name} ` +
				'(closest heavy atoms); centre-to-centre between metal (or ring) centroids.'
		};
	});
	const csv = Papa.unparse(rows, {
		columns: [
			'centreAAccession',
			'centreBAccession',
			'edgeToEdgeA',
			'centreToCentreA',
			'structureId',
			'method',
			'note'
		]
	});
	const check = await checkUpload(db, csv, 'distance', {
		viewer: input.viewer,
		uploaderId: input.uploaderId,
		limits: uploadCsvLimits
	});
	// The batch's checksum is the structure file's, so that the same file is recognised again.
	check.sha256 = input.sha256;
	check.previousUpload = null;
	// Row 1 is the header: the n-th distance is row n + 1.
	const keyOfRow = new Map(kept.map((p, n) => [n + 2, `${p.a}-${p.b}`]));
	const entryOfRow = new Map(check.entries.map((e) => [e.row, e]));
	const issuesOf = (row: number, severity: 'error' | 'warning') =>
		check.issues.filter((i) => i.row === row && i.severity === severity).map((i) => i.message);
	const proposed = kept.map((p, n): ProposedDistance => {
		const a = centreByAccession.get(input.matches[p.a]!)!;
		const b = centreByAccession.get(input.matches[p.b]!)!;
		const edgeToEdgeA = round2(p.edge.distanceA);
		const existing = protein.distances
			.filter(
				(d) =>
					(d.centreA === a.accession && d.centreB === b.accession) ||
					(d.centreA === b.accession && d.centreB === a.accession)
			)
			.map((d) => {
				const sameStructure = d.structureId.toLowerCase() === input.structureId.toLowerCase();
				return {
					...d,
					sameStructure,
					conflict: sameStructure && Math.abs(d.edgeToEdgeA - edgeToEdgeA) > CONFLICT_A
				};
			});
		// The check's "already in the registry as X" for an X listed beside the distance is said
		// there, once, with its value and whether it conflicts.
		const listed = new Set(existing.map((d) => d.accession));
		const sayAgain = new Set(
			(entryOfRow.get(n + 2)?.warnings ?? [])
				.filter((w) => w.kind === 'duplicate' && w.accession && listed.has(w.accession))
				.map(warningText)
		);
		const errors = issuesOf(n + 2, 'error');
		return {
			existing,
			key: `${p.a}-${p.b}`,
			centreA: { accession: a.accession, label: a.label, group: reading.groups[p.a]!.label },
			centreB: { accession: b.accession, label: b.label, group: reading.groups[p.b]!.label },
			edgeToEdgeA,
			atoms: `${p.edge.atomA.name}–${p.edge.atomB.name}`,
			centreToCentreA: round2(p.centreToCentreA),
			warnings: issuesOf(n + 2, 'warning').filter((w) => !sayAgain.has(w)),
			errors,
			preselected: errors.length === 0 && !existing.some((d) => d.sameStructure)
		};
	});
	return { proposed, check, keyOfRow };
}
