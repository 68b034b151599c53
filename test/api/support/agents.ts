import request from 'supertest';
import type { Express } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { WorkspaceRole } from '../../../shared/schema/api';
import { hashPassword } from '../../../server/users/password';
import { UserSchema, type User } from '../../../server/users/user.entity';
import { MembershipSchema } from '../../../server/workspaces/membership.entity';
import { WorkspaceSchema, type Workspace } from '../../../server/workspaces/workspace.entity';

export const PASSWORD = 'correct-horse-battery';
// Hashing is deliberately slow; tests make many users with the same password.
let passwordHash: Promise<string> | undefined;

/** A supertest agent with a session and the CSRF token that goes with it. */
export interface Client {
  agent: ReturnType<typeof request.agent>;
  csrf: string;
  user?: User;
}

/** A client without a session, holding a CSRF token (the anonymous caller). */
export async function anonymous(app: Express): Promise<Client> {
  const agent = request.agent(app);
  const res = await agent.get('/api/auth/csrf').expect(200);
  return { agent, csrf: res.body.token };
}

/** Signs in through the API and keeps the new CSRF token. */
export async function signIn(app: Express, email: string, password = PASSWORD): Promise<Client> {
  const client = await anonymous(app);
  const res = await client.agent
    .post('/api/auth/login')
    .set('x-csrf-token', client.csrf)
    .send({ email, password });
  if (res.status !== 200)
    throw new Error(`sign-in of ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { agent: client.agent, csrf: res.body.csrfToken };
}

/** Creates a user directly in the database (faster than registering through the API). */
export async function createUser(
  em: EntityManager,
  email: string,
  opts: { siteRole?: 'admin' | 'user'; displayName?: string } = {},
): Promise<User> {
  const user = em.create(UserSchema, {
    email,
    displayName: opts.displayName ?? email.split('@')[0],
    passwordHash: await (passwordHash ??= hashPassword(PASSWORD)),
    siteRole: opts.siteRole ?? 'user',
  });
  await em.flush();
  return user;
}

/** A workspace with the given members. */
export async function createWorkspace(
  em: EntityManager,
  name: string,
  members: [User, WorkspaceRole][],
): Promise<Workspace> {
  const workspace = em.create(WorkspaceSchema, { name });
  for (const [user, role] of members) em.create(MembershipSchema, { user, workspace, role });
  await em.flush();
  return workspace;
}

/** Methods that change state carry the CSRF header; reads do not need it. */
export function send(
  client: Client,
  method: 'get' | 'post' | 'put' | 'patch' | 'delete',
  url: string,
  body?: unknown,
) {
  const req = client.agent[method](url);
  if (method !== 'get') req.set('x-csrf-token', client.csrf);
  return body === undefined ? req : req.send(body as object);
}
