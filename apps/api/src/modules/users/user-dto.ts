import type { User as UserDto } from '@kerfline/domain/users/schema';
import type { User } from './user.model.js';

/** The user as the API shows it: never the password hash. */
export function toUserDto(
  user: Pick<User, 'id' | 'email' | 'name' | 'role' | 'siteId' | 'regionId' | 'allSites' | 'active'>,
  managedSiteIds: string[],
): UserDto {
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    siteId: user.siteId,
    regionId: user.regionId,
    managedSiteIds,
    allSites: user.allSites,
    active: user.active,
  };
}
