/**
 * `npm run build`: the web app (`ng build web`) with the first screens' code named in its index.html
 * (lib/web-build.ts).
 */
import { buildWeb } from './lib/web-build';

if (!buildWeb()) process.exit(1);
