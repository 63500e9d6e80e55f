import { isDevMode } from '@angular/core';
import { map, type OperatorFunction } from 'rxjs';
import type { z } from 'zod';
import type { ResponseContracts, ResponseName } from './response-contracts';
import { RESPONSE_SCHEMAS } from './response-schemas';

/** A response that does not have the shape its contract (libs/contracts) says. */
export class ContractDriftError extends Error {
  constructor(
    readonly what: string,
    readonly issues: readonly z.core.$ZodIssue[],
  ) {
    const first = issues[0];
    super(`${what}: the response does not match its contract${first ? ` (${first.path.join('.') || 'body'}: ${first.message})` : ''}`);
    this.name = 'ContractDriftError';
  }
}

/**
 * The client edge of a contract: in development builds and unit tests a response is parsed with the
 * schema of its name (`response-schemas.ts`) and a mismatch fails at once, naming the place, so a drift
 * between server and client shows in a unit test rather than as a wrong screen in a browser test. A
 * production build only casts (the server built the response from the same schemas), and ships no
 * schema: its `response-schemas.production.ts` has none. The body is passed on as received either way,
 * so both builds behave alike.
 */
export function checked<K extends ResponseName>(name: K, what: string): OperatorFunction<unknown, ResponseContracts[K]> {
  return map((body) => {
    const schema = RESPONSE_SCHEMAS?.[name];
    if (schema && isDevMode()) {
      const parsed = schema.safeParse(body);
      if (!parsed.success) throw new ContractDriftError(what, parsed.error.issues);
    }
    return body as ResponseContracts[K];
  });
}
