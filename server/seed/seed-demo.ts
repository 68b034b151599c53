import type { EntityManager } from '@mikro-orm/postgresql';
import { createChain } from '../chains/chain-store';
import { ChainSchema, type Chain } from '../chains/chain.entity';
import { readExamples, type ExampleChain } from '../chains/examples';
import { hashPassword } from '../users/password';
import { siteSettings } from '../users/site-settings';
import { UserSchema, type User } from '../users/user.entity';
import { MembershipSchema } from '../workspaces/membership.entity';
import { membershipsOf } from '../workspaces/membership.repository';
import { WorkspaceSchema, type Workspace } from '../workspaces/workspace.entity';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_WORKSPACE } from './demo-accounts';

/** What one seeding run added (all zero on a second run). */
export interface SeedReport {
  usersCreated: number;
  workspacesCreated: number;
  membershipsCreated: number;
  chainsCreated: number;
}

async function ensureUsers(em: EntityManager, report: SeedReport): Promise<Map<string, User>> {
  const users = new Map<string, User>();
  for (const account of DEMO_ACCOUNTS) {
    let user = await em.findOne(UserSchema, { email: account.email });
    if (!user) {
      user = em.create(UserSchema, {
        email: account.email,
        displayName: account.displayName,
        passwordHash: await hashPassword(DEMO_PASSWORD),
        siteRole: account.siteAdmin ? 'admin' : 'user',
      });
      report.usersCreated += 1;
    }
    users.set(account.email, user);
  }
  await em.flush();
  return users;
}

async function ensureWorkspace(
  em: EntityManager,
  users: Map<string, User>,
  report: SeedReport,
): Promise<Workspace> {
  const owner = users.get(DEMO_ACCOUNTS[0].email)!;
  // The demo workspace is the one of that name the demo owner belongs to (a user may
  // have made another workspace with the same name).
  const existing = await em.findOne(
    MembershipSchema,
    { user: owner.id, workspace: { name: DEMO_WORKSPACE } },
    { populate: ['workspace'] },
  );
  const workspace = existing?.workspace ?? em.create(WorkspaceSchema, { name: DEMO_WORKSPACE });
  if (!existing) report.workspacesCreated += 1;
  await em.flush();
  for (const account of DEMO_ACCOUNTS) {
    const user = users.get(account.email)!;
    if (!(await membershipsOf(em).findFor(user.id, workspace.id))) {
      em.create(MembershipSchema, { user, workspace, role: account.role });
      report.membershipsCreated += 1;
    }
  }
  await em.flush();
  return workspace;
}

// Parents before variants, so a variant can be linked to its parent's chain.
function parentsFirst(examples: ExampleChain[]): ExampleChain[] {
  return [...examples.filter((e) => !e.variantOf), ...examples.filter((e) => e.variantOf)];
}

async function loadExamples(
  em: EntityManager,
  workspace: Workspace,
  author: User,
  examples: ExampleChain[],
  report: SeedReport,
): Promise<void> {
  const byName = async (name: string) => em.findOne(ChainSchema, { workspace: workspace.id, name });
  const chainOfKey = new Map<string, Chain>();
  for (const example of parentsFirst(examples)) {
    const found = await byName(example.document.name);
    if (found) {
      chainOfKey.set(example.key, found);
      continue;
    }
    let parent: Chain | null = null;
    if (example.variantOf) {
      parent = chainOfKey.get(example.variantOf) ?? null;
      if (!parent)
        console.warn(
          `[seed] ${example.key}: variantOf "${example.variantOf}" is not an example; not linked`,
        );
    }
    const chain = await createChain(em, {
      workspace,
      document: example.document,
      user: author,
      message: `Loaded from example ${example.key}`,
      parent,
    });
    chainOfKey.set(example.key, chain);
    report.chainsCreated += 1;
  }
}

/**
 * Loads the demo accounts, the demo workspace and every example chain, adding only what is
 * missing: running it again changes nothing and never overwrites a user's edits.
 */
export async function seedDemo(em: EntityManager, examplesDir: string): Promise<SeedReport> {
  const report: SeedReport = {
    usersCreated: 0,
    workspacesCreated: 0,
    membershipsCreated: 0,
    chainsCreated: 0,
  };
  await siteSettings(em);
  const users = await ensureUsers(em, report);
  const workspace = await ensureWorkspace(em, users, report);
  const examples = await readExamples(examplesDir);
  await loadExamples(em, workspace, users.get(DEMO_ACCOUNTS[0].email)!, examples, report);
  return report;
}
