/**
 * zod 4 compiles object parsers with `Function(...)` when it may, and probes for that with a
 * try/catch. Under Edgefield's content security policy (no 'unsafe-eval', next.config.mjs) the
 * probe is refused and reported as a CSP violation; parsing then falls back anyway. Telling
 * zod up front not to compile keeps the browser's console and CSP reports clean.
 * Imported for its effect by app/providers.tsx (every page) and the Web Workers.
 */
import { z } from 'zod';

z.config({ jitless: true });
