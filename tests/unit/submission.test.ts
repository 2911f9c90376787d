import { describe, expect, it } from 'vitest';
import {
	parseEntryInput,
	reviewDecisionSchema,
	visibilityRequestSchema
} from '$lib/schemas/submission';

describe('visibility requests and decisions', () => {
	it('needs a group for group-only, and a future date and a group for an embargo', () => {
		const g = visibilityRequestSchema.safeParse({ visibility: 'group' });
		expect(g.success || g.error.issues.map((i) => i.path[0])).toEqual(['groupId']);
		const e = visibilityRequestSchema.safeParse({
			visibility: 'embargoed',
			embargoUntil: '2001-01-01'
		});
		expect(e.success || e.error.issues.map((i) => i.message)).toEqual([
			'the embargo must end in the future',
			'choose the group that may see it until then'
		]);
		expect(
			visibilityRequestSchema.parse({
				visibility: 'embargoed',
				groupId: '3',
				embargoUntil: '2099-05-01'
			})
		).toEqual({
			visibility: 'embargoed',
			groupId: 3,
			embargoUntil: '2099-05-01T00:00:00.000Z'
		});
		expect(
			visibilityRequestSchema.parse({ visibility: 'public', groupId: '3' }).groupId
		).toBeNull();
	});
	it('needs a comment to return and a reason to reject, not to approve', () => {
		expect(reviewDecisionSchema.safeParse({ decision: 'approve' }).success).toBe(true);
		expect(reviewDecisionSchema.safeParse({ decision: 'return', comment: ' ' }).success).toBe(
			false
		);
		expect(
			reviewDecisionSchema.safeParse({ decision: 'reject', comment: 'duplicate' }).success
		).toBe(true);
		expect(reviewDecisionSchema.safeParse({ decision: 'maybe' }).success).toBe(false);
	});
});

describe('a potential that converts out of range', () => {
	it('is an error on the reported value, not an exception', () => {
		const r = parseEntryInput('potential', {
			centreAccession: 'HL000001',
			couple: 'Fe3+/Fe2+',
			reportedValue: 5,
			reportedUnit: 'V',
			referenceElectrode: 'SHE',
			method: 'computed'
		});
		expect(r).toEqual({
			ok: false,
			fields: {
				reportedValue: ['converts to 5000 mV vs SHE, outside -2000 to 2000 mV; check the unit']
			}
		});
	});
});
