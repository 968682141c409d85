import { createSecretKey } from 'node:crypto';
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
      // A KeyObject made once: given a string, jsonwebtoken first tries (and fails) to read it as a
      // public key on every request, which showed as the top cost in a CPU profile of the pipeline API.
      secretOrKey: createSecretKey(Buffer.from(config.jwt.secret, 'utf8')) as unknown as Buffer,
      algorithms: ['HS256'],
    });
  }

  /** Returning null makes passport answer 401: deactivated users and superseded tokens stop here. */
  async validate(payload: TokenPayload): Promise<SessionUser | null> {
    return this.auth.userForToken(payload);
  }
}
