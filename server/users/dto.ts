import type { AdminUserDto, UserDto } from '../../shared/schema/api';
import type { User } from './user.entity';

/** The public view of a user (never the password hash). */
export function toUserDto(user: User): UserDto {
  return { id: user.id, email: user.email, displayName: user.displayName, siteRole: user.siteRole };
}

/** A row of the admin's account list: the public view plus the account's state. */
export function toAdminUserDto(user: User): AdminUserDto {
  return {
    ...toUserDto(user),
    createdAt: user.createdAt.toISOString(),
    active: !user.deactivatedAt,
    deleted: !!user.deletedAt,
  };
}
