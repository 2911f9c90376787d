/**
 * The hop-rate calculator pre-filled with a pair of centres, as a distance row links to it:
 * `/calc/hop-rate?donor=HL…&acceptor=HL…` (the calculator reads both parameters and fills in
 * the distance and ΔG from the registry; every value stays editable there).
 */
export function hopRatePath(donor: string, acceptor: string): string {
	const query = new URLSearchParams({ donor, acceptor });
	return `/calc/hop-rate?${query}`;
}
