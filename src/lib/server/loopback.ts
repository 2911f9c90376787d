import type { Server } from 'node:http';

/** Closes a loopback fake's HTTP server at once, open keep-alive connections included. */
export async function closeHttpServer(server: Server): Promise<void> {
	server.closeAllConnections();
	await new Promise<void>((resolve) => server.close(() => resolve()));
}
