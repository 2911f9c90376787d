/**
 * Calculations started per client address over a sliding window, for callers without an
 * account. In memory, per process (a restart forgives everyone: it is a brake, not a record),
 * and bounded: at most `maxKeys` addresses are remembered, the least recent forgotten first.
 */
export class AddressWindow {
	private readonly hits = new Map<string, number[]>();

	constructor(
		private readonly max: number,
		private readonly windowMs: number,
		private readonly now: () => number = Date.now,
		private readonly maxKeys = 50_000
	) {}

	private recent(key: string): number[] {
		const since = this.now() - this.windowMs;
		return (this.hits.get(key) ?? []).filter((t) => t > since);
	}

	/** Milliseconds until the key may start another calculation; 0 when it may now. */
	retryAfterMs(key: string): number {
		const list = this.recent(key);
		if (list.length < this.max) return 0;
		return Math.max(1, list[list.length - this.max]! + this.windowMs - this.now());
	}

	record(key: string): void {
		const list = [...this.recent(key), this.now()];
		this.hits.delete(key); // re-inserted last: the map's order is the order of last use
		this.hits.set(key, list);
		if (this.hits.size > this.maxKeys) {
			const oldest = this.hits.keys().next().value;
			if (oldest !== undefined) this.hits.delete(oldest);
		}
	}

	get size(): number {
		return this.hits.size;
	}
}

/**
 * The key an address is counted under: IPv4 as it is (also when written IPv4-mapped,
 * ::ffff:192.0.2.1); IPv6 by its /64 prefix, the block one host or household is usually given,
 * so that a caller cannot start afresh from every address of its own block.
 */
export function addressKey(address: string): string {
	const plain = address.trim().replace(/%.*$/, '').toLowerCase();
	const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/.exec(plain);
	if (mapped) return mapped[1]!;
	if (!plain.includes(':')) return plain;
	const [head = '', tail] = plain.split('::');
	const headGroups = head ? head.split(':') : [];
	const tailGroups = tail ? tail.split(':') : [];
	const groups =
		tail === undefined
			? headGroups
			: [
					...headGroups,
					...Array<string>(Math.max(0, 8 - headGroups.length - tailGroups.length)).fill('0'),
					...tailGroups
				];
	const prefix = groups.slice(0, 4).map((g) => g.replace(/^0+(?=.)/, '') || '0');
	while (prefix.length < 4) prefix.push('0');
	return `${prefix.join(':')}::/64`;
}
