import { UPLOAD_COLUMNS } from '$lib/catalogue/uploadColumns';
import { UPLOAD_KINDS, UPLOAD_KIND_LABELS } from '$lib/kinds';
import type { PageServerLoad } from './$types';

// The columns are built from the kinds' schemas, which stay on the server.
export const load: PageServerLoad = () => ({
	kinds: UPLOAD_KINDS,
	labels: UPLOAD_KIND_LABELS,
	columns: UPLOAD_COLUMNS
});
