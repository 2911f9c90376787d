import { LRUCache } from 'lru-cache';
import type { StructureReading } from '$lib/science';

/*
 * The groups read from a kept structure file, by attachment id, so that "Measure distances",
 * "Measure again" and "Submit" do not unpack and parse the file again on every click.
 *
 * Kept on the server rather than carried in the form: the coordinates decide the distances that
 * are submitted, and a form is whatever the client sends back. The key is the attachment id,
 * which the flow only reaches after checking that the file is the user's own (structureFile.ts),
 * and an attachment never changes, so an entry can never be stale. Bounded by count and by atoms
 * held (cofactor groups are at most 300 atoms each, structureReading.ts): a few megabytes at most.
 * A miss simply reads the file again from the store, in the worker pool.
 */
const MAX_FILES = 16;
const MAX_ATOMS = 200_000;

const atomsOf = (r: StructureReading) =>
	Math.max(
		1,
		r.groups.reduce((n, g) => n + g.atoms.length, 0)
	);

const cache = new LRUCache<number, StructureReading>({
	max: MAX_FILES,
	maxSize: MAX_ATOMS,
	sizeCalculation: atomsOf
});

export function cachedReading(attachmentId: number): StructureReading | undefined {
	return cache.get(attachmentId);
}

export function rememberReading(attachmentId: number, reading: StructureReading): void {
	// A reading larger than the whole budget is not kept (lru-cache would refuse it anyway).
	if (atomsOf(reading) <= MAX_ATOMS) cache.set(attachmentId, reading);
}

/** For tests: how many readings are held. */
export const readingCacheSize = () => cache.size;
