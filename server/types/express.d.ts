import type { User as UserEntity } from '../db/entities/user.entity';

declare global {
  namespace Express {
    // passport's req.user is our User entity.
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends UserEntity {}
  }
}

export {};
