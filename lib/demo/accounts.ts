/**
 * Demo sign-ins (demo mode only, EDGEFIELD_DEMO=1). Harrow Lane Instruments and everyone
 * here are fictional; the `.example` domain can never receive mail. Shown on the sign-in
 * page in demo mode and printed when the demo starts.
 */
export interface DemoAccount {
  email: string;
  password: string;
  name: string;
  role: 'owner' | 'editor' | 'viewer';
  /** Which demo workspace the account belongs to. */
  workspace: 'main' | 'other';
}

export const DEMO_WORKSPACE_NAME = 'Harrow Lane Instruments — Sensor Lab';
export const OTHER_WORKSPACE_NAME = 'Fenwick Ridge Controls — Drives';

/** The three accounts of the demo workspace (owner, editor, viewer). */
export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
  { email: 'maren.holt@harrowlane.example', password: 'edgefield-owner', name: 'Maren Holt', role: 'owner', workspace: 'main' },
  { email: 'tobias.quill@harrowlane.example', password: 'edgefield-editor', name: 'Tobias Quill', role: 'editor', workspace: 'main' },
  { email: 'ines.varga@harrowlane.example', password: 'edgefield-viewer', name: 'Ines Varga', role: 'viewer', workspace: 'main' },
];

/** A user of another (fictional) team: sees only their own workspace; used by the 404 tests. */
export const OTHER_DEMO_ACCOUNT: DemoAccount = {
  email: 'odile.brandt@fenwickridge.example',
  password: 'edgefield-other',
  name: 'Odile Brandt',
  role: 'owner',
  workspace: 'other',
};
