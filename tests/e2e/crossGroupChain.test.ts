import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { EntryKind } from '$lib/kinds';
import { createPasswordUser } from '$lib/server/auth/users';
import { addVersion, approveVersion, createEntry } from '$lib/server/catalogue/entries';
import { listPotentials } from '$lib/server/catalogue/potentials';
import { findVisibleEntry } from '$lib/server/catalogue/visibleEntry';
import type { Viewer } from '$lib/server/catalogue/visibility';
import { openDatabase } from '$lib/server/db/connect';
import { migrateToLatest } from '$lib/server/db/migrate';
import type { Database } from '$lib/server/db/schema';
import { potentialAtPh7 } from '../support/largeCentre';
import { startServer, type RunningServer } from '../support/server';
import { signInCookie } from '../support/session';

/*
 * Entries of two groups in one chain, built through the approval path as production builds them:
 * a potential only group A may see, on a public centre of a protein only group B may see. The
 * rule (DEVELOPERS.md "Visibility"): the potential may be shown only to a reader who may see all
 * three. A member of A alone may not (the protein's name and organism would leak), nor a member
 * of B alone (the potential would). A member of both may see each entry, and the potential's own
 * page; searches, the API list and exports leave it out for them too until it is public (the
 * read model keeps one group per row — see `earlyGroup` in catalogue/visibility.ts).
 */

const SECRET_PROTEIN = 'Crossgroupase secreta';
const SECRET_ORGANISM = 'Bifidogrex hiddenensis';
const SECRET_MV = -432.1;
const COUPLE = '[4Fe-4S]2+/1+';

const USERS = {
	a: { email: 'only-a@lab.test', password: 'only-a-password', groups: ['A'] },
	b: { email: 'only-b@lab.test', password: 'only-b-password', groups: ['B'] },
	ab: { email: 'both-ab@lab.test', password: 'both-ab-password', groups: ['A', 'B'] },
	none: { email: 'no-group@lab.test', password: 'no-group-password', groups: [] }
} as const;
type Who = keyof typeof USERS | 'signed out';
const EVERYONE: Who[] = ['signed out', 'none', 'a', 'b', 'ab'];

interface Built {
	groups: Record<'A' | 'B', number>;
	/** Group-A potential on a public centre of the group-B protein. */
	crossPotential: string;
	/** A group-A potential on a protein that turned group-B-only after the potential was approved. */
	laterPotential: string;
	laterProtein: string;
	/** Controls: a group-A potential on public entries, a group-B potential on the B protein. */
	aControl: string;
	bControl: string;
	/** A public distance from a public centre to the public centre of the group-B protein. */
	crossDistance: string;
	secretProtein: string;
}

type VisibilityAsked = { visibility: 'group'; groupId: number; embargoUntil: null } | null;

async function build(db: Kysely<Database>): Promise<Built> {
	const groups = { A: 0, B: 0 };
	for (const g of ['A', 'B'] as const) {
		({ id: groups[g] } = await db
			.insertInto('research_group')
			.values({ slug: `group-${g.toLowerCase()}`, name: `Group ${g}` })
			.returning('id')
			.executeTakeFirstOrThrow());
	}
	for (const u of Object.values(USERS)) {
		const id = await createPasswordUser(db, {
			email: u.email,
			password: u.password,
			name: u.email,
			role: 'reader',
			verified: true
		});
		for (const g of u.groups)
			await db.insertInto('group_member').values({ group_id: groups[g], user_id: id }).execute();
	}
	const only = (g: 'A' | 'B'): VisibilityAsked => ({
		visibility: 'group',
		groupId: groups[g],
		embargoUntil: null
	});
	return db.transaction().execute(async (trx) => {
		const approve = async (entryId: number, data: unknown, visibility: VisibilityAsked) =>
			approveVersion(
				trx,
				await addVersion(trx, entryId, data, { status: 'submitted', visibility })
			);
		const add = async (kind: EntryKind, data: unknown, visibility: VisibilityAsked) => {
			const entry = await createEntry(trx, { kind });
			await approve(entry.id, data, visibility);
			return entry;
		};
		const protein = (name: string, organism: string) => ({
			name,
			organism,
			structureIds: [],
			description: null
		});
		const centre = (proteinAccession: string, label: string) => ({
			proteinAccession,
			label,
			cofactorKind: 'fe4s4',
			ligation: 'Cys4',
			chainId: 'A',
			residues: [8, 11, 14, 47],
			coordinatesA: null
		});
		const potential = (centreAccession: string, mv: number) =>
			potentialAtPh7(centreAccession, COUPLE, mv);

		const publicProtein = await add('protein', protein('Openase', 'Apertus publicus'), null);
		const publicCentre = await add('centre', centre(publicProtein.accession, 'FS-open'), null);
		const secretProtein = await add('protein', protein(SECRET_PROTEIN, SECRET_ORGANISM), only('B'));
		const secretsCentre = await add('centre', centre(secretProtein.accession, 'FS-x'), null);
		const crossPotential = await add(
			'potential',
			potential(secretsCentre.accession, SECRET_MV),
			only('A')
		);
		const bControl = await add('potential', potential(secretsCentre.accession, -200), only('B'));
		const aControl = await add('potential', potential(publicCentre.accession, -210), only('A'));
		const crossDistance = await add(
			'distance',
			{
				centreAAccession: publicCentre.accession,
				centreBAccession: secretsCentre.accession,
				edgeToEdgeA: 12.5,
				centreToCentreA: 15,
				structureId: '9XYZ',
				method: 'crystal_structure'
			},
			null
		);

		// A protein public when its group-A potential was approved, made group-B-only later by an
		// approved change: the potential's row must be recomputed then.
		const laterProtein = await add('protein', protein('Lateroxin', 'Serotinus mutatus'), null);
		const laterCentre = await add('centre', centre(laterProtein.accession, 'FS-late'), null);
		const laterPotential = await add(
			'potential',
			potential(laterCentre.accession, -220),
			only('A')
		);
		await approve(laterProtein.id, protein('Lateroxin', 'Serotinus mutatus'), only('B'));

		return {
			groups,
			crossPotential: crossPotential.accession,
			laterPotential: laterPotential.accession,
			laterProtein: laterProtein.accession,
			aControl: aControl.accession,
			bControl: bControl.accession,
			crossDistance: crossDistance.accession,
			secretProtein: secretProtein.accession
		};
	});
}

let dir: string;
let db: Kysely<Database>;
let server: RunningServer;
let fx: Built;
const cookies = {} as Record<Who, string>;

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'hopline-crossgroup-'));
	const path = join(dir, 'c.sqlite');
	db = openDatabase(path);
	await migrateToLatest(db);
	fx = await build(db);
	server = await startServer(path);
	cookies['signed out'] = '';
	for (const who of Object.keys(USERS) as (keyof typeof USERS)[])
		cookies[who] = await signInCookie(server.baseUrl, USERS[who].email, USERS[who].password);
}, 120_000);

afterAll(async () => {
	await server?.stop();
	await db?.destroy();
	rmSync(dir, { recursive: true, force: true });
});

const viewerOf = (who: Who): Viewer | null =>
	who === 'signed out' ? null : { groupIds: USERS[who].groups.map((g) => fx.groups[g]) };

async function api(path: string, who: Who): Promise<string> {
	const res = await fetch(`${server.baseUrl}${path}`, {
		headers: cookies[who] ? { cookie: cookies[who] } : {}
	});
	expect(res.status, `${path} as ${who}`).toBe(200);
	return res.text();
}

/** What each reader may find in lists: the potentials whose whole chain they may see. */
const LISTED: Record<Who, (keyof Built)[]> = {
	'signed out': [],
	none: [],
	a: ['aControl'],
	b: ['bControl'],
	ab: ['aControl', 'bControl']
};
const NEVER_LISTED = ['crossPotential', 'laterPotential'] as const;

describe('a potential of one group on a protein of another', () => {
	it('is left out of searches for members of either group, and for members of both', async () => {
		for (const who of EVERYONE) {
			const page = await listPotentials(
				db,
				{},
				{ sort: 'accession', limit: 100, offset: 0 },
				viewerOf(who)
			);
			const seen = page.items.map((p) => p.accession).sort();
			expect(seen, who).toEqual(LISTED[who].map((k) => fx[k]).sort());
			expect(page.total, who).toBe(LISTED[who].length);
			const byText = await listPotentials(
				db,
				{ q: SECRET_PROTEIN },
				{ limit: 100, offset: 0 },
				viewerOf(who)
			);
			for (const k of NEVER_LISTED)
				expect(
					byText.items.map((p) => p.accession),
					who
				).not.toContain(fx[k]);
		}
	});

	it('is left out of the API list, its CSV export and the facets, with no trace of the protein', async () => {
		for (const who of EVERYONE) {
			const json = JSON.parse(await api('/api/v1/potentials?limit=100&sort=accession', who));
			expect(json.items.map((p: { accession: string }) => p.accession).sort(), who).toEqual(
				LISTED[who].map((k) => fx[k]).sort()
			);
			const csv = await api('/api/v1/potentials?limit=100&format=csv', who);
			const facets = await api('/api/v1/facets', who);
			for (const k of NEVER_LISTED) expect(csv, who).not.toContain(fx[k]);
			if (who !== 'b' && who !== 'ab') {
				// Only members of B may learn the protein exists at all.
				for (const body of [JSON.stringify(json), csv, facets]) {
					expect(body, who).not.toContain(SECRET_PROTEIN);
					expect(body, who).not.toContain(SECRET_ORGANISM);
				}
			}
			expect(csv, who).not.toContain(String(SECRET_MV));
		}
	});

	it('opens on its own page only for a member of both groups', async () => {
		for (const who of EVERYONE) {
			const found = await findVisibleEntry(db, fx.crossPotential, viewerOf(who));
			expect(found !== null, who).toBe(who === 'ab');
			const res = await fetch(`${server.baseUrl}/api/v1/entries/${fx.crossPotential}`, {
				headers: cookies[who] ? { cookie: cookies[who] } : {}
			});
			expect(res.status, who).toBe(who === 'ab' ? 200 : 404);
			await res.body?.cancel();
		}
	});

	it('is recomputed when its protein turns group-only after the potential was approved', async () => {
		const row = await db
			.selectFrom('potential')
			.select(['group_id', 'public_from'])
			.where('accession', '=', fx.laterPotential)
			.executeTakeFirstOrThrow();
		expect(row).toEqual({ group_id: null, public_from: null });
		const page = await listPotentials(
			db,
			{ protein: fx.laterProtein },
			{ limit: 100, offset: 0 },
			viewerOf('a')
		);
		expect(page.total).toBe(0);
	});
});

describe('a distance to a centre of a group-only protein', () => {
	it('is listed only for readers who may see both centres and both proteins', async () => {
		for (const who of EVERYONE) {
			const body = await api('/api/v1/distances?limit=100', who);
			const listed = JSON.parse(body).items.map((d: { accession: string }) => d.accession);
			expect(listed, who).toEqual(who === 'b' || who === 'ab' ? [fx.crossDistance] : []);
		}
	});
});
