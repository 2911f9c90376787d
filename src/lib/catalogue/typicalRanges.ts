import { formatMv } from '$lib/format';
import type { CofactorKind } from '$lib/schemas/vocabulary';

/*
 * Typical midpoint-potential ranges per cofactor kind and couple, in mV vs SHE, near neutral pH
 * and room temperature. They only raise a warning for the contributor and the curator (a value
 * outside is unusual, often a sign error, a V/mV slip or a reference-electrode mix-up, but it can
 * be real), never an error. The ranges are deliberately wide and are not adjusted for pH or
 * temperature.
 */
export interface TypicalRange {
	minMv: number;
	maxMv: number;
	/** Where the range comes from, and how sure we are of it. */
	source: string;
}

/*
 * Where each range comes from. The text is what readers see beside a warning, so it says what
 * the bounds are based on in a reader's words. How they were obtained, for maintainers: the
 * Liu et al. bounds were read off the review's potential-range figure from memory and widened by
 * about 50 mV; the flavin/quinone and active-site spans are common practice with no single
 * source, likewise recalled. Replace them with values read from the sources when someone can.
 */
const LIU_2014 =
	'typical range from a published survey (Liu et al., Chem. Rev. 114, 4366 (2014), potential-range figure); bounds approximate, widened by about 50 mV';
const FLAVIN_QUINONE =
	'typical span reported for protein-bound flavins and quinones near pH 7; bounds approximate, from no single source';
const ACTIVE_SITE =
	'typical span reported for hydrogenase and molybdenum/tungsten active sites; bounds approximate, from no single source';

const range = (minMv: number, maxMv: number, source: string): TypicalRange => ({
	minMv,
	maxMv,
	source
});

const TYPICAL_RANGES: Partial<Record<CofactorKind, Record<string, TypicalRange>>> = {
	fe2s2_ferredoxin: { '[2Fe-2S]2+/1+': range(-500, -100, LIU_2014) },
	fe2s2_rieske: { '[2Fe-2S]2+/1+': range(-200, 450, LIU_2014) },
	fe3s4: {
		'[3Fe-4S]1+/0': range(-500, 150, LIU_2014),
		'[3Fe-4S]0/2-': range(-900, -400, LIU_2014)
	},
	fe4s4: {
		'[4Fe-4S]2+/1+': range(-750, -50, LIU_2014),
		'[4Fe-4S]1+/0': range(-1100, -500, LIU_2014)
	},
	fe4s4_hipip: { '[4Fe-4S]3+/2+': range(0, 550, LIU_2014) },
	heme_a: { 'Fe3+/Fe2+': range(100, 500, LIU_2014) },
	heme_b: { 'Fe3+/Fe2+': range(-450, 450, LIU_2014) },
	heme_c: { 'Fe3+/Fe2+': range(-450, 450, LIU_2014) },
	fmn: {
		'ox/sq': range(-500, 150, FLAVIN_QUINONE),
		'sq/hq': range(-550, 50, FLAVIN_QUINONE),
		'ox/hq': range(-450, 50, FLAVIN_QUINONE)
	},
	fad: {
		'ox/sq': range(-500, 150, FLAVIN_QUINONE),
		'sq/hq': range(-550, 50, FLAVIN_QUINONE),
		'ox/hq': range(-450, 50, FLAVIN_QUINONE)
	},
	ubiquinone: quinoneRanges(),
	menaquinone: quinoneRanges(),
	plastoquinone: quinoneRanges(),
	cu_type1: { 'Cu2+/Cu+': range(150, 1050, LIU_2014) },
	cu_a: { 'CuA ox/red': range(150, 450, LIU_2014) },
	mo_w_pterin: {
		'Mo(VI)/Mo(V)': range(-600, 350, ACTIVE_SITE),
		'Mo(V)/Mo(IV)': range(-600, 350, ACTIVE_SITE),
		'W(VI)/W(V)': range(-700, 100, ACTIVE_SITE),
		'W(V)/W(IV)': range(-700, 100, ACTIVE_SITE)
	},
	nife: {
		'Ni-SI/Ni-C': range(-550, -50, ACTIVE_SITE),
		'Ni-C/Ni-R': range(-550, -50, ACTIVE_SITE)
	},
	fefe: { 'Hox/Hred': range(-600, -200, ACTIVE_SITE) }
};

function quinoneRanges(): Record<string, TypicalRange> {
	return {
		'Q/SQ': range(-350, 300, FLAVIN_QUINONE),
		'SQ/QH2': range(-250, 500, FLAVIN_QUINONE),
		'Q/QH2': range(-300, 350, FLAVIN_QUINONE)
	};
}

/** The typical range of a couple of a cofactor kind, or null when none is on record. */
export function typicalRange(kind: CofactorKind, couple: string): TypicalRange | null {
	return TYPICAL_RANGES[kind]?.[couple] ?? null;
}

/** A value outside its typical range: how far, and the range with its source. */
export interface RangeWarning {
	emMvShe: number;
	range: TypicalRange;
	message: string;
}

export function checkTypicalRange(
	kind: CofactorKind,
	couple: string,
	emMvShe: number
): RangeWarning | null {
	const r = typicalRange(kind, couple);
	if (!r || (emMvShe >= r.minMv && emMvShe <= r.maxMv)) return null;
	const side = emMvShe < r.minMv ? 'below' : 'above';
	return {
		emMvShe,
		range: r,
		// Numbers as shown everywhere: a Unicode minus, the unit after a no-break space.
		message: `${formatMv(emMvShe, 1)} vs SHE is ${side} the typical range for ${couple} (${formatMv(r.minMv)} to ${formatMv(r.maxMv)} vs SHE). Check the sign, the unit and the reference electrode.`
	};
}
