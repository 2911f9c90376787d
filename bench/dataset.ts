import SQLite from 'better-sqlite3';
import { existsSync, mkdirSync, rmSync } from 'node:fs';
import { dirname } from 'node:path';
import { formatAccession } from '../src/lib/schemas/accession';
import {
	COUPLES_BY_KIND,
	COFACTOR_KINDS,
	POTENTIAL_METHODS,
	type CofactorKind
} from '../src/lib/schemas/vocabulary';
import { openDatabase } from '../src/lib/server/db/connect';
import { ALWAYS_PUBLIC } from '../src/lib/server/catalogue/visibility';
import { migrateToLatest } from '../src/lib/server/db/migrate';

/**
 * A generated catalogue for benchmarks: proteins, centres and potentials with approved first
 * versions and their read-model rows, written straight through prepared statements (loading
 * 100 000 entries through the curation services would time the seed, not the queries).
 * Deterministic: the same sizes give the same file.
 */

export interface DatasetSize {
	proteins: number;
	centresPerProtein: number;
	potentialsPerCentre: number;
}

const WORDS = [
	'thermo',
	'ferro',
	'hydro',
	'nitro',
	'sulfo',
	'cyto',
	'photo',
	'methano',
	'aceto',
	'halo'
];
const ORGANISMS = Array.from(
	{ length: 40 },
	(_, i) =>
		`Benchmarkia ${WORDS[i % 10]}${['philus', 'genes', 'vorans', 'cola'][Math.floor(i / 10)]}`
);
const PROTEIN_KINDS = [
	'ferredoxin',
	'hydrogenase',
	'oxidoreductase',
	'cytochrome',
	'reductase',
	'dehydrogenase',
	'oxidase'
];

function lcg(seed: number) {
	let state = seed >>> 0;
	return () => {
		state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
		return state / 2 ** 32;
	};
}

export async function ensureDataset(
	path: string,
	size: DatasetSize
): Promise<{ created: boolean; seconds: number }> {
	if (existsSync(path)) return { created: false, seconds: 0 };
	const started = performance.now();
	mkdirSync(dirname(path), { recursive: true });
	const kysely = openDatabase(path);
	await migrateToLatest(kysely);
	await kysely.destroy();

	const sqlite = new SQLite(path);
	sqlite.pragma('journal_mode = WAL');
	sqlite.pragma('synchronous = OFF');
	const random = lcg(42);
	const pick = <T>(list: readonly T[]): T => list[Math.floor(random() * list.length)] as T;
	const approvedAt = '2025-01-01T00:00:00.000Z';

	const insertEntry = sqlite.prepare(
		'insert into entry (id, accession, kind, visibility) values (?, ?, ?, ?)'
	);
	const insertVersion = sqlite.prepare(
		"insert into entry_version (entry_id, version, status, data, approved_at) values (?, 1, 'approved', ?, ?)"
	);
	const insertProtein = sqlite.prepare(
		"insert into protein (entry_id, version, name, organism, uniprot, structure_ids, revision) values (?, 1, ?, ?, null, '[]', 1)"
	);
	const insertCentre = sqlite.prepare(
		"insert into centre (entry_id, version, protein_entry_id, label, cofactor_kind, ligation, chain_id, residues, revision) values (?, 1, ?, ?, ?, 'Cys4', 'A', '[]', 1)"
	);
	const insertPotential = sqlite.prepare(
		`insert into potential (entry_id, accession, version, centre_entry_id, centre_accession, centre_label,
			cofactor_kind, protein_entry_id, protein_accession, protein_name, organism, couple, em_mv_she,
			reported_value, reported_unit, reference_electrode, ph, temperature_k, ionic_strength_m, buffer, method,
			n_electrons, uncertainty_mv, source_entry_id, is_demo, public_from, group_id)
		 values (?, ?, 1, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, 'mV', 'SHE', ?, ?, null, null, ?, 1, ?, null, 0, ?, null)`
	);
	const kinds = COFACTOR_KINDS.filter((k) => k !== 'other');

	let id = 0;
	sqlite.transaction(() => {
		for (let p = 0; p < size.proteins; p++) {
			const proteinId = ++id;
			const proteinAccession = formatAccession(proteinId);
			const name = `${pick(WORDS)}philic ${pick(PROTEIN_KINDS)} ${String.fromCharCode(65 + (p % 26))}${p}`;
			const organism = pick(ORGANISMS);
			insertEntry.run(proteinId, proteinAccession, 'protein', 'public');
			insertVersion.run(
				proteinId,
				JSON.stringify({ name, organism, uniprot: null, structureIds: [], description: null }),
				approvedAt
			);
			insertProtein.run(proteinId, name, organism);
			for (let c = 0; c < size.centresPerProtein; c++) {
				const centreId = ++id;
				const kind = pick(kinds) as CofactorKind;
				const label = `C${c + 1}`;
				insertEntry.run(centreId, formatAccession(centreId), 'centre', 'public');
				insertVersion.run(
					centreId,
					JSON.stringify({
						proteinAccession,
						label,
						cofactorKind: kind,
						ligation: 'Cys4',
						chainId: 'A',
						residues: [],
						coordinatesA: null,
						note: null
					}),
					approvedAt
				);
				insertCentre.run(centreId, proteinId, label, kind);
				for (let k = 0; k < size.potentialsPerCentre; k++) {
					const potentialId = ++id;
					const em = Math.round(-500 + random() * 900);
					const ph = Math.round((5 + random() * 5) * 10) / 10;
					const temperature = pick([277.15, 288.15, 298.15, 308.15, 338.15]);
					const method = pick(POTENTIAL_METHODS);
					const couple = COUPLES_BY_KIND[kind][0] ?? 'ox/red';
					insertEntry.run(potentialId, formatAccession(potentialId), 'potential', 'public');
					insertVersion.run(
						potentialId,
						JSON.stringify({
							centreAccession: formatAccession(centreId),
							couple,
							reportedValue: em,
							reportedUnit: 'mV',
							referenceElectrode: 'SHE',
							ph,
							temperatureK: temperature,
							ionicStrengthM: null,
							buffer: null,
							method,
							nElectrons: 1,
							uncertaintyMv: 10,
							sourceAccession: null,
							note: null,
							emMvShe: em
						}),
						approvedAt
					);
					insertPotential.run(
						potentialId,
						formatAccession(potentialId),
						centreId,
						formatAccession(centreId),
						label,
						kind,
						proteinId,
						proteinAccession,
						name,
						organism,
						couple,
						em,
						em,
						ph,
						temperature,
						method,
						10,
						ALWAYS_PUBLIC
					);
				}
			}
		}
		sqlite.prepare('update catalogue_state set revision = 1 where id = 1').run();
	})();
	sqlite.pragma('wal_checkpoint(TRUNCATE)');
	sqlite.exec('analyze');
	sqlite.close();
	return { created: true, seconds: (performance.now() - started) / 1000 };
}

export function removeDataset(path: string): void {
	for (const suffix of ['', '-wal', '-shm']) rmSync(path + suffix, { force: true });
}
