import type { OrderByItemBuilder } from 'kysely';

/** The one ordering rule of every catalogue list: chosen direction, missing values last. */
export function nullsLast(direction: 'asc' | 'desc') {
	return (ob: OrderByItemBuilder) =>
		direction === 'asc' ? ob.asc().nullsLast() : ob.desc().nullsLast();
}
