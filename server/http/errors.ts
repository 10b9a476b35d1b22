import type { ErrorRequestHandler, RequestHandler, Response } from 'express';
import { z } from 'zod';

import { zodIssues, type ApiError } from '@/lib/api-errors';
import type { Logger } from '@/server/logger';

type Issue = NonNullable<ApiError['error']['issues']>[number];

/** An error meant for the client: its status, code and message are sent as they are. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly issues?: Issue[],
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

export const unauthorized = (message = 'Sign in to continue.', code = 'unauthorized') =>
  new HttpError(401, code, message);
export const forbidden = (message = 'Your role does not allow this.') =>
  new HttpError(403, 'forbidden', message);
export const notFound = (message = 'Not found.') => new HttpError(404, 'not_found', message);
export const conflict = (message: string, code = 'conflict') => new HttpError(409, code, message);

export function sendError(res: Response, status: number, code: string, message: string, issues?: Issue[]) {
  const body: ApiError = { error: { code, message, ...(issues ? { issues } : {}) } };
  res.status(status).json(body);
}

/** Any request that reached the end of the /api router: JSON 404, whatever the method. */
export const apiNotFound: RequestHandler = (req, res) => {
  sendError(res, 404, 'not_found', `No API route for ${req.method} ${req.baseUrl}${req.path}.`);
};

/** The shapes body-parser gives its errors. */
const bodyParserErrorSchema = z.object({ type: z.string(), status: z.number().int() });
/** A client error a library raised: http-errors style marked safe to show, or the router's URIError. */
function libraryClientError(err: unknown): number | null {
  const shape = z.object({ status: z.number().int().min(400).max(499), expose: z.boolean().optional() });
  const found = shape.safeParse(err);
  if (!found.success) return null;
  return found.data.expose === true || err instanceof URIError ? found.data.status : null;
}

/** Status codes whose generic message we are happy to show for errors raised by middleware. */
const genericClientErrors: Record<number, [code: string, message: string]> = {
  400: ['bad_request', 'The request could not be understood.'],
  401: ['unauthorized', 'Sign in to continue.'],
  403: ['forbidden', 'Your role does not allow this.'],
  404: ['not_found', 'Not found.'],
  405: ['method_not_allowed', 'This method is not allowed here.'],
  409: ['conflict', 'The request conflicts with the current state.'],
  413: ['payload_too_large', 'The request body is too large.'],
  415: ['unsupported_media_type', 'Send the body as JSON (UTF-8).'],
  429: ['too_many_requests', 'Too many requests. Try again later.'],
};

/**
 * The one error handler: every failure leaves as `{error:{code,message,issues?}}`. Unexpected errors are
 * logged in full here and answered with a generic 500, so no stack trace or internal detail reaches a client.
 */
export function errorHandler(logger: Logger): ErrorRequestHandler {
  return (err: unknown, req, res, next) => {
    if (res.headersSent) {
      next(err);
      return;
    }
    if (err instanceof HttpError) {
      sendError(res, err.status, err.code, err.message, err.issues);
      return;
    }
    if (err instanceof z.ZodError) {
      sendError(res, 400, 'validation_failed', 'Some fields are missing or invalid.', zodIssues(err));
      return;
    }
    const parserError = bodyParserErrorSchema.safeParse(err);
    if (parserError.success) {
      const { type, status } = parserError.data;
      if (type === 'entity.parse.failed') {
        sendError(res, 400, 'bad_json', 'The request body is not valid JSON.');
        return;
      }
      const generic = genericClientErrors[status];
      if (generic) {
        sendError(res, status, generic[0], generic[1]);
        return;
      }
    }
    // Client errors raised below the routes (a malformed percent-escape in a path parameter is the
    // router's URIError with status 400): the client's mistake, answered in the API's shape.
    const clientStatus = libraryClientError(err);
    if (clientStatus !== null) {
      const [code, message] = genericClientErrors[clientStatus] ?? genericClientErrors[400];
      sendError(res, clientStatus, code, message);
      return;
    }
    logger.error({ err, method: req.method, url: req.originalUrl }, 'unhandled error');
    sendError(
      res,
      500,
      'internal_error',
      'Something went wrong on the server. Try again; if it persists, tell us.',
    );
  };
}
