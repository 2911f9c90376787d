import type { CentreDto, DistanceDto, PotentialDto, SpinRecordDto } from '$lib/catalogue/dto';
import type { RelatedPage, RelatedRecords } from '$lib/server/catalogue/related';
import { COFACTOR_KIND_LABELS } from '$lib/schemas/vocabulary';

/*
 * The columns the entry page's related tables show, and nothing else: every field of a load's
 * answer is serialised into the page, and the full rows repeat the protein and its organism in
 * each of them, which these tables never print. A centre's cofactor kind comes with its label,
 * so that the page needs no vocabulary.
 */
type Shown<T, K extends keyof T> = Pick<T, K>;
type Label = { accession: string; label: string };

export interface ShownRelated {
	centres: RelatedPage<
		Shown<CentreDto, 'accession' | 'label' | 'ligation' | 'chainId' | 'residues'> & {
			cofactorLabel: string;
		}
	> | null;
	potentials: RelatedPage<
		Shown<
			PotentialDto,
			'accession' | 'couple' | 'emMvShe' | 'uncertaintyMv' | 'ph' | 'temperatureK'
		> & {
			centre: Label;
		}
	>;
	spinRecords: RelatedPage<
		Shown<SpinRecordDto, 'accession' | 'oxidationLevel' | 'spinS' | 'gValues' | 'temperatureK'> & {
			centre: Label;
		}
	>;
	distances: RelatedPage<
		Shown<
			DistanceDto,
			'accession' | 'centreToCentreAngstrom' | 'edgeToEdgeAngstrom' | 'structureId'
		> & {
			centreA: Label;
			centreB: Label;
		}
	>;
}

const label = (c: { accession: string; label: string }): Label => ({
	accession: c.accession,
	label: c.label
});

function mapPage<T, U>(page: RelatedPage<T>, row: (item: T) => U): RelatedPage<U> {
	return { ...page, items: page.items.map(row) };
}

export function shownRelated(related: RelatedRecords): ShownRelated {
	return {
		centres: related.centres
			? mapPage(related.centres, (c) => ({
					accession: c.accession,
					label: c.label,
					cofactorLabel: COFACTOR_KIND_LABELS[c.cofactorKind],
					ligation: c.ligation,
					chainId: c.chainId,
					residues: c.residues
				}))
			: null,
		potentials: mapPage(related.potentials, (p) => ({
			accession: p.accession,
			centre: label(p.centre),
			couple: p.couple,
			emMvShe: p.emMvShe,
			uncertaintyMv: p.uncertaintyMv,
			ph: p.ph,
			temperatureK: p.temperatureK
		})),
		spinRecords: mapPage(related.spinRecords, (r) => ({
			accession: r.accession,
			centre: label(r.centre),
			oxidationLevel: r.oxidationLevel,
			spinS: r.spinS,
			gValues: r.gValues,
			temperatureK: r.temperatureK
		})),
		distances: mapPage(related.distances, (d) => ({
			accession: d.accession,
			centreA: label(d.centreA),
			centreB: label(d.centreB),
			centreToCentreAngstrom: d.centreToCentreAngstrom,
			edgeToEdgeAngstrom: d.edgeToEdgeAngstrom,
			structureId: d.structureId
		}))
	};
}
