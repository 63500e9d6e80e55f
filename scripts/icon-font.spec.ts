import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ICON_FONT, readManifest, sha256, shaper, toTrueType, usedIconNames } from './icon-font';

describe('the icon font', () => {
  const manifest = readManifest();
  const font = readFileSync(ICON_FONT);

  it('holds every icon the app names (run `npm run icons` after using a new one)', async () => {
    expect(manifest.names).toEqual(await usedIconNames());
    expect(sha256(font)).toBe(manifest.sha256);
  });

  it('draws each of those icons as one glyph, and no icon the app does not name', async () => {
    const hb = await import('harfbuzzjs');
    const shape = shaper(hb, await toTrueType(font));
    for (const name of manifest.names) expect(shape(name), name).toHaveLength(1);
    // 'home' and 'favorite' are Material Symbols icons Laminote does not use: the subset drops them.
    for (const name of ['home', 'favorite'].filter((n) => !manifest.names.includes(n))) expect(shape(name).length).toBe(name.length);
  });

  it('is a small fraction of the full icon font it is cut from', () => {
    expect(font.byteLength).toBeLessThan(64 * 1024);
  });
});
