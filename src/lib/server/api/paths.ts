/** Whether a path belongs to the JSON API (`/api/v1` and below; `/api` itself is a page). */
export function isApiPath(pathname: string): boolean {
	return pathname === '/api/v1' || pathname.startsWith('/api/v1/');
}
