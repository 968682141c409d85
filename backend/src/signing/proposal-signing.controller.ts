import {
  Body,
  Controller,
  Get,
  HttpCode,
  Param,
  ParseUUIDPipe,
  Post,
  Req,
  Res,
  StreamableFile,
} from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiProduces, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import type { ContractView, SendProposalResponse } from '@loambook/common';
import { Can, CurrentUser } from '../common/decorators';
import type { SessionUser } from '../auth/session-user';
import { SendProposalDto, SignInPersonDto } from './dto/signing.dto';
import { SigningService } from './signing.service';
import { evidenceOf, pdfFile } from './signing.controller';

@ApiTags('proposals')
@ApiBearerAuth()
@Controller('proposals')
export class ProposalSigningController {
  constructor(private readonly signing: SigningService) {}

  @Get(':id/pdf')
  @Can('read', 'Proposal')
  @ApiProduces('application/pdf')
  @ApiOperation({ summary: 'The proposal as a PDF (every option, findings, cautions, notices)' })
  async pdf(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    return pdfFile(res, await this.signing.proposalPdf(user, id));
  }

  @Post(':id/send')
  @HttpCode(200)
  @Can('update', 'Proposal')
  @ApiOperation({
    summary: 'E-mail an approved proposal with a signing link and the PDF (again: earlier links stop)',
  })
  send(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: SendProposalDto,
  ): Promise<SendProposalResponse> {
    return this.signing.send(user, id, dto);
  }

  @Post(':id/sign-in-person')
  @Can('update', 'Proposal')
  @ApiOperation({ summary: 'The homeowner signs on the salesperson’s device: the same contract as online' })
  signInPerson(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: SignInPersonDto,
    @Req() req: Request,
  ): Promise<ContractView> {
    return this.signing.signInPerson(user, id, dto, evidenceOf(req));
  }
}
