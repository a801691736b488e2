import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';

export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export const badRequest = (message: string, fields?: Record<string, string>) =>
  new HttpError(400, 'bad_request', message, fields);
export const notFound = (what = 'That record') => new HttpError(404, 'not_found', `${what} was not found.`);
export const forbidden = (message = 'Your role does not allow this.') => new HttpError(403, 'forbidden', message);
export const unauthorised = (message = 'Sign in first.') => new HttpError(401, 'unauthorised', message);
export const conflict = (message: string, extra?: Record<string, unknown>) =>
  new HttpError(409, 'conflict', message, undefined, extra);

/** Turns zod issues into {field path: message}, the shape forms show beside inputs. */
export function fieldsFromZod(error: ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.join('.') || '_';
    fields[key] ??= issue.message;
  }
  return fields;
}

export const notFoundHandler: RequestHandler = (req, _res, next) => {
  next(new HttpError(404, 'not_found', `No API route for ${req.method} ${req.path}.`));
};

interface BodyParserError {
  type?: string;
  status?: number;
  expose?: boolean;
}

const MULTER_MESSAGES: Record<string, [number, string]> = {
  LIMIT_FILE_SIZE: [413, 'Files can be at most 15 MB.'],
  LIMIT_FILE_COUNT: [400, 'Send one file at a time.'],
  LIMIT_UNEXPECTED_FILE: [400, 'Send the file in the multipart field "file".'],
  LIMIT_PART_COUNT: [400, 'Too many parts in the upload.'],
  LIMIT_FIELD_COUNT: [400, 'Too many fields in the upload.'],
};

function fromBodyParser(err: BodyParserError & { name?: string; code?: string; message?: string }): HttpError | null {
  if (err.name === 'MulterError' && err.code) {
    const [status, message] = MULTER_MESSAGES[err.code] ?? [400, 'The upload could not be read.'];
    return new HttpError(status, status === 413 ? 'too_large' : 'bad_upload', message);
  }
  // busboy: a multipart body that is cut short or malformed
  if (typeof err.message === 'string' && /Multipart|Unexpected end of form|Malformed part header/i.test(err.message))
    return badRequest('The upload was cut short or malformed. Try again.');
  if (err.type === 'entity.parse.failed') return badRequest('The request body is not valid JSON.');
  if (err.type === 'entity.too.large') return new HttpError(413, 'too_large', 'The request body is too large.');
  if (err.type === 'encoding.unsupported' || err.type === 'charset.unsupported')
    return new HttpError(415, 'unsupported_encoding', 'Send the body as UTF-8.');
  if (err.expose && err.status && err.status >= 400 && err.status < 500)
    return new HttpError(err.status, 'bad_request', 'The request could not be read.');
  return null;
}

const CONNECTION_ERRORS = new Set(['ECONNREFUSED', 'ECONNRESET', 'PROTOCOL_CONNECTION_LOST', 'ETIMEDOUT', 'EPIPE']);

function isDatabaseDown(err: unknown): boolean {
  const e = err as { code?: string; cause?: { code?: string }; message?: string };
  return CONNECTION_ERRORS.has(e?.cause?.code ?? e?.code ?? '') || /connection is in closed state/.test(e?.message ?? '');
}

/** The one error handler: JSON always, no stack traces, 5xx only for our own faults. */
export function errorHandler(log: { error: (obj: object, msg: string) => void }): ErrorRequestHandler {
  return (err, req, res, _next) => {
    let httpError: HttpError | null = null;
    if (err instanceof HttpError) httpError = err;
    else if (err instanceof ZodError) httpError = badRequest('Some fields are not valid.', fieldsFromZod(err));
    else if (err && typeof err === 'object') httpError = fromBodyParser(err as BodyParserError);
    if (!httpError && isDatabaseDown(err)) {
      log.error({ err, reqId: req.id }, 'database unavailable');
      httpError = new HttpError(503, 'db_unavailable', 'The database is not answering right now. Nothing was saved; try again in a moment.');
    }
    if (!httpError) {
      log.error({ err, reqId: req.id }, 'unhandled error');
      httpError = new HttpError(500, 'internal', 'Something went wrong on our side. Try again; if it keeps happening, tell your manager.');
    }
    if (res.headersSent) return;
    res.status(httpError.status).json({
      error: { code: httpError.code, message: httpError.message, ...(httpError.fields ? { fields: httpError.fields } : {}) },
      ...httpError.extra,
    });
  };
}
