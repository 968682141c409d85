import { Body, Controller, Get, HttpCode, Param, ParseUUIDPipe, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import { Can, CurrentUser } from '../common/decorators';
import type { SessionUser } from '../auth/session-user';
import { CreatePaymentLinkDto, PaymentListQueryDto, RecordPaymentDto, RefundDto } from './dto/payments.dto';
import type {
  ContractPayments,
  PaymentLinkResult,
  PaymentList,
  PaymentRequestView,
  PaymentView,
  RefundView,
} from '@loambook/common';
import { PaymentsService } from './payments.service';

@ApiTags('payments')
@ApiBearerAuth()
@Controller()
export class PaymentsController {
  constructor(private readonly payments: PaymentsService) {}

  @Get('contracts/:id/payments')
  @Can('read', 'Contract')
  @ApiOperation({ summary: 'The contract’s payment links, payments, refunds and balance due' })
  forContract(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
  ): Promise<ContractPayments> {
    return this.payments.forContract(user, id);
  }

  @Post('contracts/:id/payment-links')
  @Can('read', 'Contract')
  @ApiOperation({ summary: 'A card payment link for the deposit or the balance, e-mailed to the homeowner' })
  createLink(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: CreatePaymentLinkDto,
  ): Promise<PaymentLinkResult> {
    return this.payments.createLink(user, id, dto);
  }

  @Post('payment-requests/:id/resend')
  @HttpCode(200)
  @Can('read', 'Contract')
  @ApiOperation({ summary: 'E-mail an open payment link to the homeowner again' })
  resend(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
  ): Promise<PaymentRequestView> {
    return this.payments.resend(user, id);
  }

  @Post('contracts/:id/payments')
  @Can('create', 'Payment')
  @ApiOperation({ summary: 'Record cash, a cheque or a transfer received (the bookkeeper)' })
  record(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: RecordPaymentDto,
  ): Promise<PaymentView> {
    return this.payments.recordPayment(user, id, dto);
  }

  @Post('contracts/:id/refunds')
  @Can('create', 'Payment')
  @ApiOperation({ summary: 'Refund a cancelled contract’s card payments through the processor' })
  refund(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: RefundDto,
  ): Promise<RefundView[]> {
    return this.payments.refund(user, id, dto);
  }

  @Get('payments')
  @Can('read', 'Payment')
  @ApiOperation({ summary: 'Payments received, by branch and dates' })
  list(@CurrentUser() user: SessionUser, @Query() q: PaymentListQueryDto): Promise<PaymentList> {
    return this.payments.list(user, q);
  }
}
