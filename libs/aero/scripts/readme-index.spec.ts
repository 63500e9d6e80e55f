import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { METHODS } from '../src/methods/index';
import { withCurrentIndex } from './readme-index';

describe('the methods index of libs/aero/README.md', () => {
  it('lists every method as the code describes it (rewrite with: npx tsx libs/aero/scripts/readme-index.ts --write)', () => {
    const readme = readFileSync(new URL('../README.md', import.meta.url), 'utf8');
    expect(readme).toBe(withCurrentIndex(readme));
    for (const method of METHODS) expect(readme).toContain(`\`${method.module}\``);
  });
});
