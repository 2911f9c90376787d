import { potentialConversionNote } from '$lib/catalogue/potentialConversion';
import { ENTRY_KIND_LABELS, fieldLabel, formatKindField, type EntryKind } from '$lib/kinds';
import {
	REFERENCE_ELECTRODE_LABELS,
	REFERENCE_ELECTRODES,
	type ReferenceElectrode
} from '$lib/science/referenceElectrodes';
import { METHOD_LABELS } from '$lib/schemas/vocabulary';

/*
 * The words an entry page prints about its version, made by the load: what the kind is called,
 * each field's label and text, the headline's method and electrode, and how a potential was
 * converted to SHE. The kinds' modules, the vocabularies and the electrode table live with
 * their schemas; the page gets their words, not their code.
 */

/** One field of the frozen block, as the page prints it (references and DOIs it links). */
export interface ShownField {
	field: string;
	label: string;
	text: string;
}

export interface EntryWords {
	kindLabel: string;
	fields: ShownField[];
	/** The headline's method and reference electrode, by name; null when the data has none. */
	headline: {
		method: string | null;
		electrode: { code: ReferenceElectrode; label: string } | null;
	};
	/** How a potential's Em vs SHE was obtained from the value as reported. */
	conversion: string | null;
}

function electrodeOf(value: unknown): ReferenceElectrode | null {
	return REFERENCE_ELECTRODES.find((e) => e === value) ?? null;
}

function methodOf(value: unknown): string | null {
	if (typeof value !== 'string') return null;
	return Object.entries(METHOD_LABELS).find(([method]) => method === value)?.[1] ?? value;
}

export function presentEntry(kind: EntryKind, data: Record<string, unknown>): EntryWords {
	const electrode = electrodeOf(data.referenceElectrode);
	return {
		kindLabel: ENTRY_KIND_LABELS[kind],
		fields: Object.entries(data).map(([field, value]) => ({
			field,
			label: fieldLabel(kind, field),
			text: formatKindField(kind, field, value)
		})),
		headline: {
			method: methodOf(data.method),
			electrode: electrode
				? { code: electrode, label: REFERENCE_ELECTRODE_LABELS[electrode] }
				: null
		},
		conversion: kind === 'potential' ? potentialConversionNote(data) : null
	};
}
