/// <reference types="@sveltejs/adapter-node" />
// adapter-node gives hooks the Node request as `event.platform.req` (absent under vite dev).
import type { Viewer } from '$lib/server/catalogue/visibility';
import type { SessionUser } from '$lib/server/auth/roles';
import type { ApiTokenScope } from '$lib/schemas/apiTokenScopes';

declare global {
	namespace App {
		interface Error {
			message: string;
			errorId?: string;
			/** Field name → messages, for 400s caused by bad query parameters. */
			fields?: Record<string, string[]>;
			/** For a 403 from a role guard: the least role the page needs (the error page says how to ask). */
			neededRole?: import('$lib/roles').Role;
		}
		interface Locals {
			requestId: string;
			/** The signed-in user with role and groups, read fresh each request; null when signed out. */
			user: SessionUser | null;
			/** Who is reading, for visibility rules; null when signed out. */
			viewer: Viewer | null;
			/** The personal API token an /api/v1 request came with (http/bearer.ts); null without one. */
			apiToken: { id: number; scope: ApiTokenScope } | null;
		}
	}
}

export {};
