import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { building } from '$app/environment';
import { config } from '$lib/server/config';
import { db } from '$lib/server/db';
import { migrateToLatest } from '$lib/server/db/migrate';
import { catalogueIsEmpty, loadDemoScenario } from '$seed/load';

export const init: ServerInit = async () => {
	if (building) return;
	await migrateToLatest(db);
	if (config.HOPLINE_DEMO && (await catalogueIsEmpty(db))) {
		const summary = await loadDemoScenario(db);
		console.log('Loaded the invented demo scenario:', summary);
	}
};

const attachRequestFacts: Handle = async ({ event, resolve }) => {
	event.locals.requestId = crypto.randomUUID();
	// Sign-in arrives with the accounts work; until then every reader is signed out.
	event.locals.viewer = null;
	return resolve(event);
};

export const handle: Handle = sequence(attachRequestFacts);

export const handleError: HandleServerError = ({ error, event, status, message }) => {
	const errorId = event.locals.requestId ?? crypto.randomUUID();
	if (status >= 500)
		console.error(`[${errorId}] ${event.request.method} ${event.url.pathname}`, error);
	return { message: status >= 500 ? 'Something went wrong on our side.' : message, errorId };
};
