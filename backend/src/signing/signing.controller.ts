import {
  Body,
  Controller,
  Get,
  HttpCode,
  Param,
  Post,
  Req,
  Res,
  StreamableFile,
  UseGuards,
} from '@nestjs/common';
import { ApiOperation, ApiProduces, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import type { CancelSigningResponse, SigningView } from '@loambook/common';
import { Public } from '../common/decorators';
import { CancelSigningDto, SignContractDto } from './dto/signing.dto';
import { SigningService, type SigningEvidence } from './signing.service';
import { SigningThrottlerGuard } from './signing-throttle';

/** What the request tells about the signer's device (req.ip honours trust proxy 'loopback'). */
export function evidenceOf(req: Request): SigningEvidence {
  const agent = req.headers['user-agent'];
  return {
    ip: req.ip ?? null,
    userAgent: typeof agent === 'string' && agent ? agent.slice(0, 500) : null,
  };
}

/** A PDF answer that no shared cache keeps (it is behind a secret link or a token). */
export function pdfFile(res: Response, file: { pdf: Buffer; filename: string }): StreamableFile {
  res.setHeader('Cache-Control', 'private, no-store');
  return new StreamableFile(file.pdf, {
    type: 'application/pdf',
    length: file.pdf.length,
    disposition: `inline; filename="${file.filename}"`,
  });
}

/**
 * The homeowner's signing page. Public on purpose: the homeowner has no account; the unguessable link
 * (256 random bits, expiring, only its hash stored) is the credential. Listed in the routes test.
 * Rate limited per address and route (SigningThrottlerGuard): 429 past the limit.
 */
@ApiTags('signing')
@UseGuards(SigningThrottlerGuard)
@Controller('signing')
export class SigningController {
  constructor(private readonly signing: SigningService) {}

  @Get(':token')
  @Public()
  @ApiOperation({
    summary: 'What the homeowner sees; 410 for an unknown, expired, revoked or cancelled link',
  })
  view(@Param('token') token: string, @Res({ passthrough: true }) res: Response): Promise<SigningView> {
    res.setHeader('Cache-Control', 'private, no-store');
    return this.signing.view(token);
  }

  @Get(':token/pdf')
  @Public()
  @ApiProduces('application/pdf')
  @ApiOperation({ summary: 'The proposal PDF, or the signed contract once signed' })
  async pdf(
    @Param('token') token: string,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    return pdfFile(res, await this.signing.pdfForToken(token));
  }

  @Post(':token/sign')
  @Public()
  @ApiOperation({ summary: 'Sign one option: the contract, with its last day to cancel (16 CFR 429.1(a))' })
  sign(
    @Param('token') token: string,
    @Body() dto: SignContractDto,
    @Req() req: Request,
  ): Promise<SigningView> {
    return this.signing.sign(token, dto, evidenceOf(req));
  }

  @Post(':token/cancel')
  @Public()
  @HttpCode(200)
  @ApiOperation({
    summary: 'Cancel the signed contract, through the end of its last day to cancel (branch time)',
  })
  cancel(@Param('token') token: string, @Body() dto: CancelSigningDto): Promise<CancelSigningResponse> {
    return this.signing.cancel(token, dto);
  }
}
