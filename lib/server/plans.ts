import 'server-only';
/**
 * Plans (issue 7). The free plan limits members (pending invitations count too) and stored
 * solves; the team plan lifts both to generous caps. Limits are enforced on the server and
 * refused with 402 and a sentence that says what to do.
 */
import { ApiError } from './http';

export type PlanId = 'free' | 'team';

export interface Plan {
  id: PlanId;
  name: string;
  /** Members plus pending invitations. */
  maxMembers: number;
  /** Stored solves in the workspace. */
  maxSolves: number;
  /** Price shown on the checkout page, in the smallest currency unit per month. */
  monthlyPrice: number;
  currency: 'eur';
}

export const PLANS: Record<PlanId, Plan> = {
  free: { id: 'free', name: 'Free', maxMembers: 5, maxSolves: 50, monthlyPrice: 0, currency: 'eur' },
  team: { id: 'team', name: 'Team', maxMembers: 50, maxSolves: 10_000, monthlyPrice: 2900, currency: 'eur' },
};

export function planOf(id: string | null | undefined): Plan {
  return id === 'team' ? PLANS.team : PLANS.free;
}

/**
 * Throws 402 when `used` (members + pending invitations) already fills the plan. Call it inside
 * the transaction that stores the invitation, after lockWorkspaceForLimits (db/queries/workspaces.ts).
 */
export async function assertMemberLimit(planId: string, used: number): Promise<void> {
  const plan = planOf(planId);
  if (used >= plan.maxMembers) {
    throw new ApiError(
      402,
      'plan_limit',
      `The ${plan.name} plan allows ${plan.maxMembers} members including pending invitations, and this workspace has ${used}. ` +
        (plan.id === 'free'
          ? 'An owner can upgrade to the Team plan in Settings → Plan, or revoke an invitation.'
          : 'Remove a member or revoke an invitation first.'),
    );
  }
}

/**
 * Throws 402 when the workspace already stores as many solves as its plan allows. Called by
 * insertSolve (db/queries/solves.ts) inside the solve's transaction, under the workspace lock.
 */
export function assertSolveLimit(planId: string, stored: number): void {
  const plan = planOf(planId);
  if (stored >= plan.maxSolves) {
    throw new ApiError(
      402,
      'plan_limit',
      `The ${plan.name} plan stores up to ${plan.maxSolves} solves and this workspace has ${stored}. ` +
        (plan.id === 'free'
          ? 'An owner can upgrade to the Team plan in Settings → Plan.'
          : 'Delete old solves first.'),
    );
  }
}
