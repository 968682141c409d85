import { Inject, Injectable } from '@nestjs/common';
import { PassportStrategy } from '@nestjs/passport';
import { ExtractJwt, Strategy } from 'passport-jwt';
import { APP_CONFIG, type AppConfig } from '../config/config';
import { AuthService, type TokenPayload } from './auth.service';
import type { SessionUser } from './session-user';

@Injectable()
export class JwtStrategy extends PassportStrategy(Strategy) {
  constructor(
    @Inject(APP_CONFIG) config: AppConfig,
    private readonly auth: AuthService,
  ) {
    super({
      jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
      ignoreExpiration: false,
      secretOrKey: config.jwt.secret,
      algorithms: ['HS256'],
    });
  }

  /** Returning null makes passport answer 401: deactivated users and superseded tokens stop here. */
  async validate(payload: TokenPayload): Promise<SessionUser | null> {
    return this.auth.userForToken(payload);
  }
}
