import type { User as UserEntity } from '../db/entities/user.entity';

declare global {
  namespace Express {
    // passport's req.user is our User entity.
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends UserEntity {}
    interface Request {
      /** set when the request carried a valid line-computer API token (Authorization: Bearer) */
      lineToken?: { id: string; name: string };
    }
  }
}

export {};
