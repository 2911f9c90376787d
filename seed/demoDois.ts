import type { DoiMetadata } from '../src/lib/server/sources/cslJson';
import { DEMO_SOURCES } from './demo';

/**
 * What the demo's loopback DOI service knows: the demo scenario's sources, plus invented papers
 * not yet in the registry, so a contributor can try adding a source by its DOI. All under the
 * test prefix 10.5555; none exists.
 */
export const DEMO_DOI_RECORDS: DoiMetadata[] = [
	...DEMO_SOURCES.map((s) => ({
		doi: s.doi,
		title: s.title,
		authors: s.authors,
		journal: s.journal,
		year: s.year
	})),
	{
		doi: '10.5555/hopline.demo.2026.031',
		title: 'Proton-coupled tuning of a Rieske-type cluster in a fictional thermophile bc complex',
		authors: ['Moreau, Céline', 'Achterberg, Jonas', 'Okafor, Adaeze'],
		journal: 'Journal of Demonstration Bioenergetics',
		year: 2026
	},
	{
		doi: '10.5555/hopline.demo.2026.058',
		title: 'Distances and tunnelling pathways in an invented [NiFe] hydrogenase small subunit',
		authors: ['Kowalczyk, Ewa', 'Rahman, Farid'],
		journal: 'Invented Letters in Metallobiochemistry',
		year: 2026
	}
];
