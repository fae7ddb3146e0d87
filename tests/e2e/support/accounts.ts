/** The demo sign-ins the e2e server seeds (fictional people, `.example` domain). */
import { DEMO_ACCOUNTS, DEMO_WORKSPACE_NAME, OTHER_DEMO_ACCOUNT, type DemoAccount } from '../../../lib/demo/accounts';

export type DemoRole = 'owner' | 'editor' | 'viewer';

export function demoAccount(role: DemoRole): DemoAccount {
  const a = DEMO_ACCOUNTS.find((x) => x.role === role);
  if (!a) throw new Error(`no demo account with role ${role}`);
  return a;
}

export { DEMO_ACCOUNTS, DEMO_WORKSPACE_NAME, OTHER_DEMO_ACCOUNT };

/** A short unique suffix so tests that create records do not collide on one server. */
export function unique(prefix: string): string {
  return `${prefix} ${Date.now().toString(36)}${Math.floor(Math.random() * 1296).toString(36)}`;
}
