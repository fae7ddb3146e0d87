/**
 * Next.js start-up hook: runs once when the server starts (not during `next build`).
 * Opens and migrates the database, and in demo mode seeds it and starts the mail catcher.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== 'nodejs') return;
  if (process.env.NEXT_PHASE === 'phase-production-build') return;
  const { startServer } = await import('./lib/server/startup');
  await startServer();
}
