import type { Kysely } from 'kysely';
import type { ListedPotential } from '$lib/catalogue/conflicts';
import { conditionsDistance } from '$lib/catalogue/ladder';
import type { ChainConditions } from '$lib/schemas/chainConditions';
import { isAccession } from '$lib/schemas/accession';
import type { HopPick } from '$lib/schemas/calc';
import type { FieldErrors } from '$lib/schemas/searchParams';
import { COFACTOR_KIND_LABELS, type CofactorKind } from '$lib/schemas/vocabulary';
import { formatNumber } from '$lib/format';
import { deltaGFromPotentials } from '$lib/science';
import type { Database } from '../db/schema';
import { COMPARABLE_COLUMNS, toComparable } from '../catalogue/comparablePotential';
import { potentialIsVisible, type Viewer } from '../catalogue/visibility';
import { findVisibleEntry, notVisibleMessage } from '../catalogue/visibleEntry';
import { listCentres } from '../kinds/centre';
import { listDistances } from '../kinds/distance';
import { listProteins } from '../kinds/protein';
import { CHAIN_LAMBDA_EV, choosePotential } from './chainEstimate';

/*
 * The hop-rate calculator's two centres from the registry: the protein chosen (by accession or
 * words of its name), its centres for the donor and acceptor choice, and — for a donor and an
 * acceptor — ΔG° of the hop from their potentials and the edge-to-edge distance between them,
 * each with the entries it came from.
 *
 * Only what the reader may see is used: the centres, potentials and distances are read through
 * the catalogue's visibility rules, and an accession the reader may not see gets the answer an
 * accession that does not exist gets (notVisibleMessage).
 *
 * The potentials are chosen as the chain estimate on a protein page chooses them (chainEstimate.ts,
 * choosePotential): one electron crosses, so the donor gives it up from its reduced level (a
 * flavin's sq/hq couple) and the acceptor takes it into its oxidised level (ox/sq), with the
 * two-electron couple standing in, marked, where the one-electron couple is not recorded; of each
 * couple, the value measured nearest the chosen pH and temperature (the ladder's rule,
 * ladder.ts, conditionsDistance). No pH or temperature correction is applied.
 * ΔG° = −(Em(acceptor) − Em(donor)) for one electron, in eV (science: deltaGFromPotentials).
 *
 * The distance: of the distance entries between the two centres, the one the chain estimate uses
 * (the most recent, the highest accession), edge to edge.
 */

/** Centres of one protein offered for the choice; more are reached by accession. */
export const HOP_MAX_CENTRES = 200;
/** Potentials read per centre pair; distances read per donor. */
const MAX_POTENTIALS = 500;
const MAX_DISTANCES = 500;
const MAX_PROTEIN_MATCHES = 10;

export interface PickedCentre {
	accession: string;
	label: string;
	kindLabel: string;
	protein: { accession: string; name: string };
}

export interface UsedValue {
	accession: string;
	couple: string;
	emMv: number;
	ph: number | null;
	temperatureK: number | null;
	/** Why this couple stands in for the one wanted; null when it is that one. */
	approximation: string | null;
}

export interface HopPair {
	protein: { accession: string; name: string; organism: string } | null;
	/** Several proteins match the words typed: the reader picks one. */
	proteinMatches: { accession: string; name: string; organism: string }[];
	/** The protein's centres the reader may see, for the donor and acceptor choice. */
	centres: { accession: string; label: string; kindLabel: string }[];
	donor: PickedCentre | null;
	acceptor: PickedCentre | null;
	/** ΔG° of the hop from the two potentials, and the text the field is filled with. */
	dG: { ev: number; text: string; donor: UsedValue; acceptor: UsedValue } | null;
	/** The edge-to-edge distance of the distance entry used, and the text the field is filled with. */
	distance: {
		angstrom: number;
		text: string;
		accession: string;
		structureId: string;
		centreToCentreA: number | null;
		/** How many distance entries join the two centres (the one used among them). */
		entries: number;
	} | null;
	/** What could not be filled in, and why, in the reader's words. */
	notes: string[];
	errors: FieldErrors;
	conditions: ChainConditions;
}

/** The reorganization energy offered when λ is empty: the chain estimate's, a common choice. */
export const HOP_DEFAULT_LAMBDA_EV = CHAIN_LAMBDA_EV;

const emptyPair = (conditions: ChainConditions): HopPair => ({
	protein: null,
	proteinMatches: [],
	centres: [],
	donor: null,
	acceptor: null,
	dG: null,
	distance: null,
	notes: [],
	errors: {},
	conditions
});

async function visibleCentre(
	db: Kysely<Database>,
	accession: string,
	viewer: Viewer | null
): Promise<(PickedCentre & { entryId: number; kind: CofactorKind }) | null> {
	const entry = await findVisibleEntry(db, accession, viewer);
	if (!entry || entry.kind !== 'centre') return null;
	const row = await db
		.selectFrom('centre as c')
		.innerJoin('entry as pe', 'pe.id', 'c.protein_entry_id')
		.innerJoin('protein as pr', 'pr.entry_id', 'c.protein_entry_id')
		.select(['c.label', 'c.cofactor_kind', 'pe.accession as protein_accession', 'pr.name'])
		.where('c.entry_id', '=', entry.id)
		.executeTakeFirst();
	if (!row) return null;
	return {
		entryId: entry.id,
		accession,
		label: row.label,
		kind: row.cofactor_kind,
		kindLabel: COFACTOR_KIND_LABELS[row.cofactor_kind],
		protein: { accession: row.protein_accession, name: row.name }
	};
}

/** The protein named by accession or by words of its name, among those the reader may see. */
async function findProtein(
	db: Kysely<Database>,
	text: string,
	viewer: Viewer | null
): Promise<{ chosen: HopPair['protein']; matches: HopPair['proteinMatches']; error?: string }> {
	const q = text.trim();
	const page = await listProteins(
		db,
		{ q },
		{ limit: MAX_PROTEIN_MATCHES + 1, offset: 0, sort: 'name' },
		viewer
	);
	const found = page.items.map((p) => ({
		accession: p.accession,
		name: p.name,
		organism: p.organism
	}));
	if (isAccession(q)) {
		const exact = found.find((p) => p.accession === q);
		return exact
			? { chosen: exact, matches: [] }
			: { chosen: null, matches: [], error: notVisibleMessage(q, 'protein') };
	}
	if (found.length === 1) return { chosen: found[0]!, matches: [] };
	if (found.length === 0)
		return {
			chosen: null,
			matches: [],
			error: `no protein you can see matches “${q}”; type part of its name or its accession`
		};
	return { chosen: null, matches: found.slice(0, MAX_PROTEIN_MATCHES) };
}

/** Per couple, the value measured nearest the conditions (the ladder's rule). */
function nearestByCouple(
	potentials: readonly ListedPotential[],
	conditions: ChainConditions
): Map<string, ListedPotential> {
	const byCouple = new Map<string, ListedPotential>();
	for (const p of potentials) {
		const held = byCouple.get(p.couple);
		if (!held || conditionsDistance(p, conditions) < conditionsDistance(held, conditions))
			byCouple.set(p.couple, p);
	}
	return byCouple;
}

/** ΔG° in eV as the field shows it: to 0.1 meV, a true minus sign. */
export function dGText(ev: number): string {
	return formatNumber(Number(ev.toFixed(4)));
}

export async function hopPair(
	db: Kysely<Database>,
	pick: HopPick,
	viewer: Viewer | null,
	conditions: ChainConditions
): Promise<HopPair> {
	const out = emptyPair(conditions);
	const ends: { key: 'donor' | 'acceptor'; found: Awaited<ReturnType<typeof visibleCentre>> }[] =
		[];
	for (const key of ['donor', 'acceptor'] as const) {
		const accession = pick[key];
		if (accession === undefined) continue;
		const found = await visibleCentre(db, accession, viewer);
		if (!found) out.errors[key] = [notVisibleMessage(accession, 'centre')];
		else {
			out[key] = {
				accession: found.accession,
				label: found.label,
				kindLabel: found.kindLabel,
				protein: found.protein
			};
			ends.push({ key, found });
		}
	}
	if (pick.donor !== undefined && pick.donor === pick.acceptor)
		out.errors.acceptor = ['choose a centre other than the donor'];

	const typed = pick.protein?.trim() ?? '';
	if (typed !== '') {
		const { chosen, matches, error } = await findProtein(db, typed, viewer);
		out.protein = chosen;
		out.proteinMatches = matches;
		if (error) out.errors.protein = [error];
	} else {
		const from = out.donor ?? out.acceptor;
		if (from) {
			const { chosen } = await findProtein(db, from.protein.accession, viewer);
			out.protein = chosen;
		}
	}
	if (out.protein) {
		const page = await listCentres(
			db,
			{ protein: out.protein.accession },
			{ limit: HOP_MAX_CENTRES, offset: 0, sort: 'label' },
			viewer
		);
		out.centres = page.items.map((c) => ({
			accession: c.accession,
			label: c.label,
			kindLabel: COFACTOR_KIND_LABELS[c.cofactorKind]
		}));
	}
	// A centre chosen by accession stays offered, even from another subunit or past the list's end.
	for (const c of [out.donor, out.acceptor])
		if (c && !out.centres.some((o) => o.accession === c.accession))
			out.centres.push({ accession: c.accession, label: c.label, kindLabel: c.kindLabel });

	const donor = ends.find((e) => e.key === 'donor')?.found;
	const acceptor = ends.find((e) => e.key === 'acceptor')?.found;
	if (!donor || !acceptor || out.errors.acceptor) return out;

	const rows = await db
		.selectFrom('potential as p')
		.select([...COMPARABLE_COLUMNS, 'p.centre_entry_id'])
		.where('p.centre_entry_id', 'in', [donor.entryId, acceptor.entryId])
		.where((eb) => potentialIsVisible(eb, 'p', viewer))
		.orderBy('p.entry_id')
		.limit(MAX_POTENTIALS)
		.execute();
	const of = (id: number) =>
		nearestByCouple(rows.filter((r) => r.centre_entry_id === id).map(toComparable), conditions);
	const given = choosePotential(donor.kind, of(donor.entryId), 'entry', conditions);
	const taken = choosePotential(acceptor.kind, of(acceptor.entryId), 'exit', conditions);
	const used = (pick: NonNullable<typeof given>): UsedValue => ({
		accession: pick.potential.accession,
		couple: pick.potential.couple,
		emMv: pick.potential.emMvShe,
		ph: pick.potential.ph,
		temperatureK: pick.potential.temperatureK,
		approximation: pick.approximation?.detail ?? null
	});
	for (const [end, chosen] of [
		[donor, given],
		[acceptor, taken]
	] as const)
		if (!chosen)
			out.notes.push(
				`${end.label} (${end.accession}) has no potential you can see, so ΔG° cannot be filled in.`
			);
	if (given && taken) {
		const ev = deltaGFromPotentials(given.potential.emMvShe, taken.potential.emMvShe);
		out.dG = { ev, text: dGText(ev), donor: used(given), acceptor: used(taken) };
	}

	const distances = await listDistances(
		db,
		{ centre: donor.accession },
		{ limit: MAX_DISTANCES, offset: 0, sort: 'accession' },
		viewer
	);
	const between = distances.items.filter(
		(d) =>
			(d.centreA.accession === donor.accession && d.centreB.accession === acceptor.accession) ||
			(d.centreB.accession === donor.accession && d.centreA.accession === acceptor.accession)
	);
	const chosen = between.at(-1);
	if (chosen)
		out.distance = {
			angstrom: chosen.edgeToEdgeAngstrom,
			text: formatNumber(chosen.edgeToEdgeAngstrom),
			accession: chosen.accession,
			structureId: chosen.structureId,
			centreToCentreA: chosen.centreToCentreAngstrom,
			entries: between.length
		};
	else
		out.notes.push(
			`No distance between ${donor.label} and ${acceptor.label} that you can see is recorded, so the distance cannot be filled in.`
		);
	return out;
}
