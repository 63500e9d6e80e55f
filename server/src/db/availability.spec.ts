import { describe, expect, it } from 'vitest';
import { isDatabaseUnavailable } from './availability';

describe('isDatabaseUnavailable', () => {
  it('recognises a server shutting down, wrapped the way Drizzle wraps driver errors', () => {
    // 57P01 admin_shutdown: PostgreSQL manual, Appendix A "PostgreSQL Error Codes".
    const driver = Object.assign(new Error('terminating connection due to administrator command'), { code: '57P01' });
    expect(isDatabaseUnavailable(Object.assign(new Error('Failed query: select 1'), { cause: driver }))).toBe(true);
    expect(isDatabaseUnavailable(Object.assign(new Error('the database system is starting up'), { code: '57P03' }))).toBe(true);
  });

  it('recognises a refused or cut connection', () => {
    expect(isDatabaseUnavailable(Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:5432'), { code: 'ECONNREFUSED' }))).toBe(true);
    expect(isDatabaseUnavailable(new AggregateError([Object.assign(new Error('refused'), { code: 'ECONNREFUSED' })]))).toBe(true);
    expect(isDatabaseUnavailable(new Error('Connection terminated unexpectedly'))).toBe(true);
    expect(isDatabaseUnavailable(new Error('Client has encountered a connection error and is not queryable'))).toBe(true);
  });

  it('leaves errors of the request or the code alone', () => {
    // 23505 unique_violation, 22P02 invalid_text_representation.
    expect(isDatabaseUnavailable(Object.assign(new Error('duplicate key'), { code: '23505' }))).toBe(false);
    expect(isDatabaseUnavailable(Object.assign(new Error('invalid input syntax for type uuid'), { code: '22P02' }))).toBe(false);
    expect(isDatabaseUnavailable(new TypeError('x is undefined'))).toBe(false);
    expect(isDatabaseUnavailable(null)).toBe(false);
  });
});
