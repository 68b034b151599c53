import type { WorkspaceRole } from '../../../../shared/schema/api';

const RANK: Record<WorkspaceRole, number> = { viewer: 1, editor: 2, owner: 3 };

/** Whether `role` grants at least what `minimum` does (owner > editor > viewer). */
export function roleAtLeast(
  role: WorkspaceRole | null | undefined,
  minimum: WorkspaceRole,
): boolean {
  return !!role && RANK[role] >= RANK[minimum];
}

export const ROLE_LABELS: Record<WorkspaceRole, string> = {
  owner: 'Owner',
  editor: 'Editor',
  viewer: 'Viewer',
};
