import { sequence } from '@sveltejs/kit/hooks';
import { closeIfBodyUnread } from '../requestLimits';
import { htmlCharset } from './charset';
import { checkOrigin } from './originCheck';
import { securityHeaders } from './securityHeaders';

/**
 * The HTTP hardening handles, in order: security headers on every response (outermost, so that
 * refusals get them too), the charset of HTML answers (kept answers included), closing
 * connections whose body was left unread, and the cross-site check. See DEVELOPERS.md, "HTTP
 * hardening".
 */
export const httpHardening = sequence(securityHeaders, htmlCharset, closeIfBodyUnread, checkOrigin);
