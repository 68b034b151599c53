import type { Logger } from 'pino';
import type { WorkspaceRole } from '../../shared/schema/api';
import type { Chain } from '../chains/chain.entity';
import type { User as UserEntity } from '../users/user.entity';
import type { Workspace } from '../workspaces/workspace.entity';

// Request-scoped values the middleware sets, typed once for every handler.
declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // passport's req.user is our User entity (loaded per request from the session's id).
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends UserEntity {}
    interface Request {
      /** The request id (server/common/logger.ts), sent back in `x-request-id`. */
      id: string;
      /** The request's logger: the server's, with `reqId` on every line. */
      log: Logger;
    }
    interface Locals {
      /** Set by the workspace/chain role middleware. */
      workspace?: Workspace;
      role?: WorkspaceRole;
      chain?: Chain;
    }
  }
}

export {};
