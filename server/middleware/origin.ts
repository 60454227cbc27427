import type { Request, RequestHandler } from 'express';
import { AppError } from '../errors';

const UNSAFE = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);
const ALLOWED_METHODS = 'GET, POST, PUT, PATCH, DELETE';
const ALLOWED_HEADERS = 'Content-Type, Authorization, X-CSRF-Token';

/** The page's own origin as this request reached us (what `npm run dev`'s proxy forwards). */
function ownOrigin(req: Request): string {
  return `${req.protocol}://${req.get('host') ?? ''}`;
}

/**
 * CORS for the app's public origin only: that origin gets credentialed CORS answers, any other
 * gets no CORS header at all, so browsers keep its pages from reading our answers. A write that a
 * browser sends from another site (its Origin is neither ours nor the public one) is refused
 * outright, whatever credentials it carries: SameSite cookies and the CSRF token already stop
 * most of these, and this also covers sign-in and sign-up, which have no token.
 */
export function publicOriginOnly(publicUrl: string): RequestHandler {
  const allowed = new URL(publicUrl).origin;
  return (req, res, next) => {
    const origin = req.get('origin');
    res.vary('Origin');
    if (origin === allowed) {
      res.setHeader('Access-Control-Allow-Origin', allowed);
      res.setHeader('Access-Control-Allow-Credentials', 'true');
      if (req.method === 'OPTIONS' && req.get('access-control-request-method')) {
        res.setHeader('Access-Control-Allow-Methods', ALLOWED_METHODS);
        res.setHeader('Access-Control-Allow-Headers', ALLOWED_HEADERS);
        res.setHeader('Access-Control-Max-Age', '600');
        res.status(204).end();
        return;
      }
      return next();
    }
    if (origin !== undefined && UNSAFE.has(req.method) && origin !== ownOrigin(req)) {
      return next(
        new AppError(403, 'cross_origin', 'Requests from other sites are not accepted here.'),
      );
    }
    next();
  };
}
