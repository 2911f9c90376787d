import { REFERENCE_ELECTRODE_LABELS } from '$lib/science/referenceElectrodes';
import type { AttachmentConditions } from '$lib/schemas/attachment';
import { formatKelvin, formatNumber } from './numbers';

/*
 * How an attachment's size and acquisition conditions read, wherever a file is listed (entry
 * pages, the curator's review, the contributor's submission page): one wording, one unit each.
 */

/**
 * A file size: "812 B", "19 kB", "2.4 MB". Binary multiples (1 kB = 1024 B), the convention of
 * the size limits' own messages, so a file listed as "10.0 MB" is one the limit names alike.
 */
export function formatByteSize(bytes: number): string {
	if (bytes < 1024) return `${bytes}\u00a0B`;
	if (bytes < 1024 * 1024) return `${Math.round(bytes / 1024)}\u00a0kB`;
	return `${(bytes / 1024 / 1024).toFixed(1)}\u00a0MB`;
}

/** The stated conditions in words, each with its unit, in a fixed order (unstated: left out). */
export function conditionWords(
	c: Partial<AttachmentConditions>
): { label: string; text: string }[] {
	const out: { label: string; text: string }[] = [];
	const add = (label: string, value: number | null | undefined, unit: string) => {
		if (value !== null && value !== undefined)
			out.push({ label, text: `${formatNumber(value)}\u00a0${unit}` });
	};
	if (c.temperatureK !== null && c.temperatureK !== undefined)
		out.push({ label: 'Temperature', text: formatKelvin(c.temperatureK) });
	add('Microwave frequency', c.microwaveFrequencyGHz, 'GHz');
	add('Microwave power', c.microwavePowerMw, 'mW');
	add('Modulation amplitude', c.modulationAmplitudeMt, 'mT');
	add('Scan rate', c.scanRateMvPerS, 'mV/s');
	if (c.referenceElectrode)
		out.push({
			label: 'Reference electrode',
			text: REFERENCE_ELECTRODE_LABELS[c.referenceElectrode]
		});
	return out;
}
