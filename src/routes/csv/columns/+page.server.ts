import { UPLOAD_COLUMNS } from '$lib/catalogue/uploadColumns';
import type { PageServerLoad } from './$types';

// The columns are built from the kinds' schemas, which stay on the server.
export const load: PageServerLoad = () => ({ columns: UPLOAD_COLUMNS });
