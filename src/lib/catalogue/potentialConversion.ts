import { z } from 'zod';
import { formatMv } from '$lib/format';
import { STANDARD_TEMPERATURE_K, ZERO_CELSIUS_K } from '$lib/science/constants';
import {
	REFERENCE_ELECTRODES,
	REFERENCE_ELECTRODE_LABELS,
	describeTemperatureRange,
	electrodeOffsetMv,
	electrodeTemperatureProblem,
	hydrogenElectrodePressureShiftMv,
	type ReferenceElectrode
} from '$lib/science/referenceElectrodes';

/*
 * How a potential's normalised Em was obtained from the value as reported, in one sentence for
 * its page: the electrode, the temperature the conversion ran at and the offset used, with the
 * electrode's range (referenceElectrodes.ts, TEMPERATURE_RANGES). Derived from the version's own
 * data only, so it reads the same for as long as the version exists.
 */
export function conversionNote(electrode: ReferenceElectrode, temperatureK: number | null): string {
	const t = temperatureK ?? STANDARD_TEMPERATURE_K;
	const at = `${Number((t - ZERO_CELSIUS_K).toFixed(2))} °C${temperatureK === null ? ' (no temperature given: 25 °C assumed)' : ''}`;
	const label = REFERENCE_ELECTRODE_LABELS[electrode];
	if (electrode === 'SHE') return 'Reported vs SHE: Em vs SHE is the value as reported.';
	if (electrode === 'NHE') {
		const atm = Math.abs(hydrogenElectrodePressureShiftMv(1.01325)).toFixed(2);
		return `Reported vs NHE, converted as SHE (offset 0): papers writing "vs NHE" almost always mean the SHE. A historical NHE (1 N acid, hydrogen at 1 atm) differs from the SHE by a few mV, mostly from the activity of H⁺ in 1 N acid; the 1 atm / 1 bar change of standard pressure alone is ${atm} mV.`;
	}
	const problem = electrodeTemperatureProblem(electrode, t);
	if (problem !== null) {
		// Possible only for versions approved before the ranges were checked.
		return `Converted from ${label} at ${at}, outside the ${describeTemperatureRange(electrode)} over which this conversion holds (approved before that range was checked): Em vs SHE may be off by tens of mV.`;
	}
	const offset = electrodeOffsetMv(electrode, t);
	return electrode === 'SCE'
		? `Converted from ${label} at ${at} with the SCE's temperature law (Bard & Faulkner 2001, Table C.2; used for ${describeTemperatureRange(electrode)}): +${formatMv(offset, 1)}.`
		: `Converted from ${label} with its 25 °C offset, +${formatMv(offset, 1)}, at ${at} (25 °C values are used for ${describeTemperatureRange(electrode)} only).`;
}

const conversionFields = z.object({
	referenceElectrode: z.enum(REFERENCE_ELECTRODES),
	temperatureK: z.number().nullable()
});

/** The note for a potential version's data (as a page receives it), or null when it has none. */
export function potentialConversionNote(data: Record<string, unknown>): string | null {
	const parsed = conversionFields.safeParse(data);
	return parsed.success
		? conversionNote(parsed.data.referenceElectrode, parsed.data.temperatureK)
		: null;
}
