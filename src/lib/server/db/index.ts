import { config } from '../config';
import { openDatabase } from './connect';

/** The app's one Kysely instance. Services receive it (or a transaction) as their first argument. */
export const db = openDatabase(config.DATABASE_PATH);

export type { Database } from './schema';
