import { describe, expect, it } from 'vitest';
import { isDatabaseUnavailable } from './availability';

// Codes from PostgreSQL's documentation, appendix A (errcodes): class 08 connection exception,
// 57P01 admin_shutdown, 57P02 crash_shutdown, 57P03 cannot_connect_now; 23505 unique_violation.
describe('isDatabaseUnavailable', () => {
	it('recognises refused and dropped connections', () => {
		expect(isDatabaseUnavailable(Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:5432'), { code: 'ECONNREFUSED' }))).toBe(true);
		expect(isDatabaseUnavailable(new Error('Connection terminated unexpectedly'))).toBe(true);
		expect(isDatabaseUnavailable(new Error('timeout exceeded when trying to connect'))).toBe(true);
		expect(isDatabaseUnavailable(new AggregateError([Object.assign(new Error('x'), { code: 'ECONNREFUSED' })]))).toBe(true);
		expect(isDatabaseUnavailable(new Error('wrapped', { cause: Object.assign(new Error('y'), { code: 'ECONNRESET' }) }))).toBe(true);
	});
	it('recognises server-side shutdown SQLSTATEs', () => {
		for (const code of ['57P01', '57P02', '57P03', '08006', '08001']) expect(isDatabaseUnavailable(Object.assign(new Error('pg'), { code }))).toBe(true);
	});
	it('leaves ordinary database and program errors alone', () => {
		expect(isDatabaseUnavailable(Object.assign(new Error('duplicate key value'), { code: '23505' }))).toBe(false);
		expect(isDatabaseUnavailable(new TypeError('x is undefined'))).toBe(false);
		expect(isDatabaseUnavailable(null)).toBe(false);
		expect(isDatabaseUnavailable('ECONNREFUSED')).toBe(false);
	});
});
