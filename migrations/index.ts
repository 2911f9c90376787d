import type { Migration } from 'kysely';
import * as m0001 from './0001_create_schema';
import * as m0002 from './0002_add_curation_workflow';
import * as m0003 from './0003_add_upload_batches';
import * as m0004 from './0004_add_session_revocation';
import * as m0005 from './0005_create_backup_log';
import * as m0006 from './0006_structure_version_warnings';
import * as m0007 from './0007_recompute_potential_groups';
import * as m0008 from './0008_create_entry_kinds';
import * as m0009 from './0009_pin_version_references';
import * as m0010 from './0010_add_citation_credit';
import * as m0011 from './0011_add_api_token_scope';
import * as m0012 from './0012_add_access_requests';
import * as m0013 from './0013_create_attachment_files';
import * as m0014 from './0014_add_attachment_numbers';

/**
 * Every migration, by name, in order. Listed by hand (one line per new file) because the same
 * list must be found by `vite dev`, vitest, tsx scripts and the adapter-node bundle alike, and
 * only a static import works in all four. A unit test fails when a file here is not listed.
 */
export const migrations: Record<string, Migration> = {
	'0001_create_schema': m0001,
	'0002_add_curation_workflow': m0002,
	'0003_add_upload_batches': m0003,
	'0004_add_session_revocation': m0004,
	'0005_create_backup_log': m0005,
	'0006_structure_version_warnings': m0006,
	'0007_recompute_potential_groups': m0007,
	'0008_create_entry_kinds': m0008,
	'0009_pin_version_references': m0009,
	'0010_add_citation_credit': m0010,
	'0011_add_api_token_scope': m0011,
	'0012_add_access_requests': m0012,
	'0013_create_attachment_files': m0013,
	'0014_add_attachment_numbers': m0014
};
