import type { RequestHandler } from 'express';
import type { Logger } from './logger';

/**
 * Logs one line per API request at debug level: method, path (no query string, which may carry
 * user input), status and duration. Bodies, cookies and headers are never logged.
 */
export function requestLog(logger: Logger): RequestHandler {
  return (req, res, next) => {
    const started = process.hrtime.bigint();
    res.on('finish', () => {
      const ms = Number(process.hrtime.bigint() - started) / 1e6;
      logger.debug('request', {
        method: req.method,
        path: req.originalUrl.split('?')[0],
        status: res.statusCode,
        ms: Math.round(ms * 10) / 10,
      });
    });
    next();
  };
}
