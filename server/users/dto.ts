import type { UserDto } from '../../shared/schema/api';
import type { User } from './user.entity';

/** The public view of a user (never the password hash). */
export function toUserDto(user: User): UserDto {
  return { id: user.id, email: user.email, displayName: user.displayName, siteRole: user.siteRole };
}
