import { createParamDecorator, type ExecutionContext, SetMetadata } from '@nestjs/common';
import type { Action, SubjectType } from '@loambook/common';
import type { SessionUser } from '../auth/session-user';

export const IS_PUBLIC = 'loambook:isPublic';
/** Opts a route out of the global token check: sign-in, health, password setting, payment webhooks. */
export const Public = () => SetMetadata(IS_PUBLIC, true);

export const REQUIRED_PERMISSION = 'loambook:permission';
export interface RequiredPermission {
  action: Action;
  subject: SubjectType;
}
/**
 * The action and subject type the route needs. The guard checks the type-level rule ("may this role
 * read some User at all?"); services check the particular record.
 */
export const Can = (action: Action, subject: SubjectType) =>
  SetMetadata(REQUIRED_PERMISSION, { action, subject } satisfies RequiredPermission);

export const CurrentUser = createParamDecorator((_data: unknown, ctx: ExecutionContext): SessionUser => {
  return ctx.switchToHttp().getRequest<{ user: SessionUser }>().user;
});
