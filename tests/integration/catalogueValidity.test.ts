import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'kysely';
import { catalogueValidityReader, nextUtcMidnight } from '$lib/server/catalogue/validity';
import { createTempDatabase } from '../support/tempDb';

let t: Awaited<ReturnType<typeof createTempDatabase>>;
beforeAll(async () => {
	t = await createTempDatabase();
});
afterAll(async () => t.remove());

async function addEntry(visibility: string, embargoUntil: string | null): Promise<void> {
	await sql`insert into entry (accession, kind, visibility, embargo_until)
		values (${`HL${String(Math.floor(Math.random() * 1e6)).padStart(6, '0')}`}, 'potential', ${visibility}, ${embargoUntil})`.execute(
		t.db
	);
}

describe('how long a signed-out reader’s view of the catalogue holds', () => {
	it('until midnight, the next embargo end, or the next revision', async () => {
		const now = new Date('2026-12-02T10:00:00.000Z');
		const validity = catalogueValidityReader(t.db);
		const first = await validity(now);
		expect(first.validUntil).toBe(nextUtcMidnight(now));

		// An embargo ending this afternoon shortens it, but only once the revision moves
		// (every write that sets an embargo bumps it) or the remembered validity runs out.
		await addEntry('embargoed', '2026-12-02T14:00:00.000Z');
		await addEntry('embargoed', '2026-12-02T09:00:00.000Z'); // already over: ignored
		await addEntry('group', '2026-12-02T11:00:00.000Z'); // not embargoed: ignored
		expect((await validity(now)).validUntil).toBe(first.validUntil);
		await sql`update catalogue_state set revision = revision + 1 where id = 1`.execute(t.db);
		const second = await validity(now);
		expect(second.revision).toBe(first.revision + 1);
		expect(second.validUntil).toBe(Date.parse('2026-12-02T14:00:00.000Z'));

		// Once that embargo is over, the validity runs to midnight again.
		const later = new Date('2026-12-02T15:00:00.000Z');
		expect((await validity(later)).validUntil).toBe(nextUtcMidnight(later));
	});
});
