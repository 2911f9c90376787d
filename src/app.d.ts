import type { Viewer } from '$lib/server/catalogue/visibility';

declare global {
	namespace App {
		interface Error {
			message: string;
			errorId?: string;
			/** Field name → messages, for 400s caused by bad query parameters. */
			fields?: Record<string, string[]>;
		}
		interface Locals {
			requestId: string;
			/** Who is reading, for visibility rules; null when signed out. */
			viewer: Viewer | null;
		}
	}
}

export {};
