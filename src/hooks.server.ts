import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { building, version } from '$app/environment';
import { config } from '$lib/server/config';
import { db } from '$lib/server/db';
import { migrateToLatest } from '$lib/server/db/migrate';
import { authHandle } from '$lib/server/auth/authjs';
import { loadSessionUser } from '$lib/server/auth/users';
import { hasSessionCookie } from '$lib/server/auth/sessionCookie';
import { oidcSettings } from '$lib/server/auth/oidc';
import { catalogueIsEmpty, loadDemoScenario } from '$seed/load';
import { appAttachmentDeps } from '$seed/demoAttachments';
import { ensureDemoAccounts } from '$seed/accounts';
import { scheduleDigests } from '$lib/server/curation/digestSchedule';
import { startAttachmentCleanup } from '$lib/server/attachments/cleanupSchedule';
import { limitRequestSize } from '$lib/server/requestLimits';
import { secureCookiesOnlyOverHttps } from '$lib/server/secureCookies';
import { httpHardening } from '$lib/server/http';
import { apiBoundary } from '$lib/server/api/boundary';
import { authenticateBearer } from '$lib/server/http/bearer';
import { viewerOf } from '$lib/server/catalogue/visibility';
import { createReadCache } from '$lib/server/http/readCache';
import { createCachingHandle } from '$lib/server/http/caching';
import { catalogueValidityReader } from '$lib/server/catalogue/validity';
import { createLoopTurns } from '$lib/server/http/loopTurns';

export const init: ServerInit = async () => {
	if (building) return;
	await migrateToLatest(db);
	if (config.HOPLINE_DEMO && (await catalogueIsEmpty(db))) {
		const summary = await loadDemoScenario(db, { attachments: appAttachmentDeps() });
		console.log('Loaded the invented demo scenario:', summary);
	}
	if (config.HOPLINE_DEMO) await ensureDemoAccounts(db);
	// Pages name the OpenID Connect issuer in their policy; in demo mode that starts the local
	// provider, which is better done now than in the middle of the first reader's request.
	await oidcSettings().catch((e: unknown) => console.error('OpenID Connect is not available:', e));
	scheduleDigests(db, { hourUtc: config.DIGEST_HOUR_UTC, origin: config.ORIGIN });
	startAttachmentCleanup(db, config.ATTACHMENT_CLEANUP_INTERVAL_MINUTES);
};

const loopTurns =
	config.LOOP_TURN_BUDGET_MS > 0 ? createLoopTurns(config.LOOP_TURN_BUDGET_MS) : null;
const shareLoopTurns: Handle = async ({ event, resolve }) => {
	const wait = loopTurns?.admit();
	if (wait) await wait;
	return resolve(event);
};

const catalogueValidity = catalogueValidityReader(db);
const readCache =
	config.READ_CACHE_MAX_MB > 0
		? createReadCache({
				validity: catalogueValidity,
				maxBytes: config.READ_CACHE_MAX_MB * 1024 * 1024,
				maxEntryBytes: config.READ_CACHE_ENTRY_MAX_KB * 1024
			})
		: null;
const cacheSignedOutReads: Handle = (input) =>
	readCache ? readCache.handle(input) : input.resolve(input.event);

/** ETags, 304s and Cache-Control of catalogue reads for every reader (http/caching.ts). */
const cacheCatalogueReads = createCachingHandle({ validity: catalogueValidity, build: version });

const attachRequestFacts: Handle = async ({ event, resolve }) => {
	event.locals.requestId = crypto.randomUUID();
	event.locals.user = null;
	event.locals.viewer = null;
	event.locals.apiToken = null;
	return resolve(event);
};

/**
 * Reads the session's user (role, groups) from the database, so changes apply at once. Reading
 * the session also checks that it was not ended (signed out, reset, disabled: auth/sessions.ts).
 * An API request with a token is answered for the token alone (`authenticateBearer`), never
 * for a session cookie it may carry too.
 */
const attachUser: Handle = async ({ event, resolve }) => {
	if (event.locals.apiToken || !hasSessionCookie(event.request)) return resolve(event);
	const session = await event.locals.auth();
	const id = session?.user?.id;
	if (id) {
		event.locals.user = await loadSessionUser(db, id);
		event.locals.viewer = event.locals.user ? viewerOf(event.locals.user) : null;
	}
	return resolve(event);
};

export const handle: Handle = sequence(
	shareLoopTurns,
	attachRequestFacts,
	httpHardening,
	apiBoundary,
	limitRequestSize,
	secureCookiesOnlyOverHttps,
	authenticateBearer,
	cacheSignedOutReads,
	authHandle,
	attachUser,
	cacheCatalogueReads
);

export const handleError: HandleServerError = ({ error, event, status, message }) => {
	const errorId = event.locals.requestId ?? crypto.randomUUID();
	if (status >= 500)
		console.error(`[${errorId}] ${event.request.method} ${event.url.pathname}`, error);
	return { message: status >= 500 ? 'Something went wrong on our side.' : message, errorId };
};
