import type { ErrorRequestHandler, RequestHandler } from 'express';
import { HttpProblem } from './problem';

// 57014: a statement cancelled by statement_timeout, i.e. the database too slow to answer.
const DATABASE_DOWN_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', '57014', '57P01', '57P02', '57P03', '08000', '08003', '08006']);

function isDatabaseUnavailable(error: unknown): boolean {
  if (!error || typeof error !== 'object') return false;
  const code = (error as { code?: unknown }).code;
  if (typeof code === 'string' && DATABASE_DOWN_CODES.has(code)) return true;
  const message = (error as { message?: unknown }).message;
  return typeof message === 'string' && /Connection terminated|timeout exceeded when trying to connect|is not queryable|Query read timeout/i.test(message);
}

/** Body-parser and file-serving errors carry `status`; they are the client's fault, never a 500. */
function bodyParserProblem(error: unknown): HttpProblem | null {
  if (!error || typeof error !== 'object') return null;
  const { type, status } = error as { type?: unknown; status?: unknown };
  if (type === 'entity.too.large') return new HttpProblem(413, 'Body too large', 'The request body is larger than the server accepts.');
  if (type === 'entity.parse.failed') return new HttpProblem(400, 'Bad request', 'The request body is not valid JSON.', [{ path: 'body', message: 'Not valid JSON' }]);
  if (type === 'encoding.unsupported' || type === 'charset.unsupported')
    return new HttpProblem(415, 'Unsupported encoding', 'The request body must be UTF-8 JSON.');
  if (typeof status === 'number' && status >= 400 && status < 500 && typeof type === 'string')
    return new HttpProblem(status, 'Bad request', 'The request body could not be read.');
  // Other client errors raised inside Express (http-errors marks them `expose`), e.g. a file not found.
  if (typeof status === 'number' && status >= 400 && status < 500 && (error as { expose?: unknown }).expose === true)
    return new HttpProblem(status, status === 404 ? 'Not found' : 'Bad request', status === 404 ? 'Nothing here.' : 'The request could not be served.');
  return null;
}

export const notFoundHandler: RequestHandler = (req, res) => {
  res.status(404).json({ status: 404, title: 'Not found', detail: `No route ${req.method} ${req.originalUrl.split('?')[0]}.`, errors: [] });
};

/** The one place errors become responses: known problems keep their status, the rest a logged 500. */
export const errorHandler: ErrorRequestHandler = (error, req, res, _next) => {
  let problem = error instanceof HttpProblem ? error : bodyParserProblem(error);
  if (!problem && isDatabaseUnavailable(error)) {
    problem = new HttpProblem(503, 'Database unavailable', 'The database cannot be reached right now; try again in a few seconds.', [], {
      'Retry-After': '5',
    });
    req.log?.warn({ err: error }, 'database unavailable');
  }
  if (!problem) {
    req.log?.error({ err: error }, 'unhandled error');
    problem = new HttpProblem(500, 'Internal error', 'Something went wrong on the server; it has been logged.');
  }
  if (res.headersSent) return;
  for (const [name, value] of Object.entries(problem.headers)) res.setHeader(name, value);
  res.status(problem.status).type('application/problem+json').json(problem.toJSON());
};
