import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { formatPath, fromZodError, parse, ProblemError } from './problem';
import { safeReturnTo } from '../auth/routes';

describe('problem details (RFC 9457)', () => {
  it('writes a zod path the way people read it', () => {
    expect(formatPath(['cells', 2, 'inputs', 'reynolds'])).toBe('cells[2].inputs.reynolds');
    expect(formatPath([])).toBe('');
  });

  it('turns invalid input into a 400 that names each field', () => {
    const schema = z.object({ email: z.string().email('email must be an e-mail address'), role: z.enum(['lead', 'viewer']) });
    const problem = fromZodError(schema.safeParse({ email: 'x', role: 'pilot' }).error!);
    expect(problem.status).toBe(400);
    expect(problem.toProblem()).toMatchObject({ type: '/problems/invalid-input', field: 'email' });
    expect(problem.toProblem().errors?.map((e) => e.field)).toEqual(['email', 'role']);
  });

  it('returns typed data when the input is valid and throws a ProblemError when not', () => {
    expect(parse(z.object({ n: z.number() }), { n: 3 })).toEqual({ n: 3 });
    expect(() => parse(z.object({ n: z.number() }), { n: 'three' })).toThrow(ProblemError);
  });
});

describe('sign-in return address', () => {
  it('accepts only same-site paths, so sign-in cannot be an open redirect', () => {
    expect(safeReturnTo('/projects/42')).toBe('/projects/42');
    for (const bad of ['https://evil.example/', '//evil.example', '/\\evil.example', undefined, 42]) expect(safeReturnTo(bad)).toBe('/');
  });
});
