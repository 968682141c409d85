import { Body, Controller, Get, HttpCode, Param, Post, UseGuards } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { MeResponse, PasswordTokenInfo, SessionResponse } from '@loambook/common';
import { CurrentUser, Public } from '../common/decorators';
import { AuthService } from './auth.service';
import { LoginDto, SetPasswordDto } from './dto/auth.dto';
import { LoginThrottlerGuard } from './guards';
import type { SessionUser } from './session-user';

@ApiTags('auth')
@Controller('auth')
export class AuthController {
  constructor(private readonly auth: AuthService) {}

  @Public()
  @UseGuards(LoginThrottlerGuard)
  @Post('login')
  @HttpCode(200)
  login(@Body() dto: LoginDto): Promise<SessionResponse> {
    return this.auth.login(dto.email, dto.password);
  }

  @ApiBearerAuth()
  @Get('me')
  me(@CurrentUser() user: SessionUser): MeResponse {
    return this.auth.me(user);
  }

  @Public()
  @UseGuards(LoginThrottlerGuard)
  @Get('password-links/:token')
  passwordLink(@Param('token') token: string): Promise<PasswordTokenInfo> {
    return this.auth.passwordTokenInfo(token);
  }

  @Public()
  @UseGuards(LoginThrottlerGuard)
  @Post('password')
  @HttpCode(200)
  setPassword(@Body() dto: SetPasswordDto): Promise<SessionResponse> {
    return this.auth.setPassword(dto.token, dto.password);
  }
}
