import type { AbilityUser, AppAbility, AuthUser } from '@loambook/common';

/** The person behind a request, as the guard attaches it to `req.user`. */
export interface SessionUser extends AuthUser, AbilityUser {
  ability: AppAbility;
}
