import { minutes, SharedRateLimiter } from '../../platform/rate-limit';

// ---------------------------------------------------------------------------------------------
// Per-address rate limits, counted in PostgreSQL so that every app process shares them.
// Numbers: common practice, no source.

export const inquiryLimiter = new SharedRateLimiter('inquiry', [
	{ hits: 10, windowMs: minutes(15) },
	{ hits: 40, windowMs: minutes(24 * 60) }
]);
export const uploadLimiter = new SharedRateLimiter('upload', [{ hits: 60, windowMs: minutes(15) }]);
