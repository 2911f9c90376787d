import { describe, expect, it } from 'vitest';
import { conditionWords, formatByteSize } from '$lib/format/attachments';

describe('attachment sizes and conditions in words', () => {
	it('writes sizes in binary multiples, as the limit messages do', () => {
		expect(formatByteSize(812)).toBe('812\u00a0B');
		expect(formatByteSize(19 * 1024)).toBe('19\u00a0kB');
		expect(formatByteSize(10 * 1024 * 1024)).toBe('10.0\u00a0MB');
	});

	it('names each stated condition with its unit, in a fixed order, and leaves out the rest', () => {
		expect(
			conditionWords({
				referenceElectrode: 'AgAgCl_sat',
				scanRateMvPerS: 20,
				temperatureK: 298.15,
				microwaveFrequencyGHz: null
			}).map((w) => w.label)
		).toEqual(['Temperature', 'Scan rate', 'Reference electrode']);
		expect(conditionWords({ microwaveFrequencyGHz: 9.4 })).toEqual([
			{ label: 'Microwave frequency', text: '9.4\u00a0GHz' }
		]);
		expect(conditionWords({})).toEqual([]);
	});
});
