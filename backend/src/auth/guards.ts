import { type ExecutionContext, Injectable, type CanActivate } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { AuthGuard } from '@nestjs/passport';
import { ThrottlerGuard } from '@nestjs/throttler';
import { DomainError } from '../common/domain-error';
import { IS_PUBLIC, REQUIRED_PERMISSION, type RequiredPermission } from '../common/decorators';
import type { SessionUser } from './session-user';

/** Global: every route needs a valid bearer token unless it is marked @Public(). */
@Injectable()
export class JwtAuthGuard extends AuthGuard('jwt') {
  constructor(private readonly reflector: Reflector) {
    super();
  }

  override canActivate(context: ExecutionContext) {
    const isPublic = this.reflector.getAllAndOverride<boolean>(IS_PUBLIC, [
      context.getHandler(),
      context.getClass(),
    ]);
    if (isPublic) return true;
    return super.canActivate(context);
  }

  override handleRequest<T>(err: unknown, user: T): T {
    if (err || !user) {
      throw new DomainError('unauthorized', 'AUTH.REQUIRED', 'Your session has ended. Please sign in again.');
    }
    return user;
  }
}

/** Global, after the token check: the route's @Can(action, subject) must be allowed for some record. */
@Injectable()
export class PermissionsGuard implements CanActivate {
  constructor(private readonly reflector: Reflector) {}

  canActivate(context: ExecutionContext): boolean {
    const need = this.reflector.getAllAndOverride<RequiredPermission | undefined>(REQUIRED_PERMISSION, [
      context.getHandler(),
      context.getClass(),
    ]);
    if (!need) return true;
    const user = context.switchToHttp().getRequest<{ user?: SessionUser }>().user;
    if (!user) return true; // public route
    if (!user.ability.can(need.action, need.subject)) {
      throw new DomainError('forbidden', 'AUTH.FORBIDDEN', 'Your role does not allow this.');
    }
    return true;
  }
}

/** Throttles sign-in attempts per address and e-mail, so one attacker cannot lock out a whole office. */
@Injectable()
export class LoginThrottlerGuard extends ThrottlerGuard {
  protected override async getTracker(req: Record<string, unknown>): Promise<string> {
    const body = (req.body ?? {}) as { email?: unknown };
    const email = typeof body.email === 'string' ? body.email.trim().toLowerCase() : '';
    return `${String(req.ip)}|${email}`;
  }
}
