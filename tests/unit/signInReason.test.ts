import { describe, expect, it } from 'vitest';
import { signInReason } from '$lib/signInReason';
import { SUBMISSION_STATES, submissionStateName } from '$lib/catalogue/submissionStates';

describe('signInReason', () => {
	it('says why for the protected areas, from the path only', () => {
		expect(signInReason('/submissions/new/potential')).toBe('Sign in to submit entries.');
		expect(signInReason('/submissions/upload?kind=centre')).toBe('Sign in to submit entries.');
		expect(signInReason('/submissions/12')).toBe('Sign in to see your submissions.');
		expect(signInReason('/review/3?page=2')).toBe('Sign in to review submissions.');
		expect(signInReason('/admin/users')).toBe('Sign in to manage the registry.');
	});

	it('says nothing for other pages, look-alike paths, other sites or crafted text', () => {
		expect(signInReason('/')).toBeNull();
		expect(signInReason(null)).toBeNull();
		expect(signInReason('/reviewers')).toBeNull();
		expect(signInReason('//evil.example/review')).toBeNull();
		expect(signInReason('https://evil.example/review')).toBeNull();
		expect(signInReason('/search?q=<b>Sign in to win</b>')).toBeNull();
	});
});

describe('submission state names', () => {
	it('gives every state one name, distinct from the others', () => {
		const names = SUBMISSION_STATES.map(submissionStateName);
		expect(new Set(names).size).toBe(SUBMISSION_STATES.length);
		expect(submissionStateName('submitted')).toBe('awaiting review');
		expect(submissionStateName('partially_approved')).toBe('partly approved');
	});
});
