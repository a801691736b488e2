// What the logs must never hold: a session cookie or CSRF token copied from a log line acts as
// its user, and a failed query's parameters can be password or token hashes, or a whole walk.
import type { Logger } from 'pino';
import { stdSerializers } from 'pino';

export const LOG_REDACT_PATHS = [
  'req.headers.cookie',
  'req.headers.authorization',
  'req.headers["x-csrf-token"]',
  'res.headers["set-cookie"]',
];

type SerializedError = ReturnType<typeof stdSerializers.err> & { params?: unknown; sql?: unknown; cause?: SerializedError };

/** Drops the bound values a failed query carries (drizzle's "params:" and mysql2's `sql`), keeping the SQL text and the cause. */
function withoutValues(serialized: SerializedError): SerializedError {
  const { params: _params, sql: _sql, ...rest } = serialized;
  const message = typeof rest.message === 'string' ? rest.message.replace(/\nparams: [\s\S]*?(?=;? *caused by|$)/, '') : rest.message;
  const stack = typeof rest.stack === 'string' ? rest.stack.replace(/\nparams: [\s\S]*?(?=\n {4}at )/, '') : rest.stack;
  return { ...rest, message, stack, ...(rest.cause && typeof rest.cause === 'object' ? { cause: withoutValues(rest.cause) } : {}) } as SerializedError;
}

export const errSerializer = (err: Error) => withoutValues(stdSerializers.err(err) as SerializedError);

/** The logger every request and error goes through: headers redacted, query values dropped. */
export const safeLogger = (log: Logger): Logger =>
  log.child({}, { redact: LOG_REDACT_PATHS, serializers: { err: errSerializer } });
