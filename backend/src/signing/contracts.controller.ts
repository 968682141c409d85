import {
  Body,
  Controller,
  Get,
  HttpCode,
  Param,
  ParseUUIDPipe,
  Post,
  Res,
  StreamableFile,
} from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiProduces, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import type { ContractView } from '@loambook/common';
import { Can, CurrentUser } from '../common/decorators';
import type { SessionUser } from '../auth/session-user';
import { CancelContractDto } from './dto/signing.dto';
import { ContractsService } from './contracts.service';
import { pdfFile } from './signing.controller';

@ApiTags('contracts')
@ApiBearerAuth()
@Controller()
export class ContractsController {
  constructor(private readonly contracts: ContractsService) {}

  @Get('contracts/:id')
  @Can('read', 'Contract')
  get(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<ContractView> {
    return this.contracts.get(user, id);
  }

  @Get('contracts/:id/pdf')
  @Can('read', 'Contract')
  @ApiProduces('application/pdf')
  async pdf(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    return pdfFile(res, await this.contracts.pdf(user, id));
  }

  @Get('leads/:leadId/contract')
  @Can('read', 'Contract')
  @ApiOperation({ summary: 'The lead’s latest contract' })
  forLead(
    @CurrentUser() user: SessionUser,
    @Param('leadId', ParseUUIDPipe) leadId: string,
  ): Promise<ContractView> {
    return this.contracts.forLead(user, leadId);
  }

  @Post('contracts/:id/cancel')
  @HttpCode(200)
  @Can('update', 'Contract')
  @ApiOperation({
    summary:
      'Record a cancellation made by mail or phone: inside the window; after it only an owner or manager',
  })
  cancel(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: CancelContractDto,
  ): Promise<ContractView> {
    return this.contracts.cancel(user, id, dto);
  }
}
