// Imported first by every module here that builds schemas. zod decides when a z.object is built whether
// to compile a fast parser with `new Function`, which the pages' Content-Security-Policy forbids (no
// 'unsafe-eval'); even its probe for eval is reported as a violation. So: no compiled parsers, ever.
import { z } from 'zod';

z.config({ jitless: true });
