import path from 'node:path';

/** The read-only shared folder that sits beside the checkout (../shared), wherever the checkout is. */
export const SHARED_DIR = path.resolve(process.cwd(), '..', 'shared');
export const SHARED_SAMPLES = path.join(SHARED_DIR, 'samples');
