import { Controller, Get, Headers, HttpCode, Param, Post, Req, Res } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import { Public } from '../common/decorators';
import type { CheckoutStatus } from '@loambook/common';
import { PaymentsService } from './payments.service';
import { WebhooksService } from './webhooks.service';

/**
 * The two routes the outside world reaches without a token:
 * - the processor's webhook, whose credential is the signature over the raw body (verified by the SDK);
 * - the homeowner's thank-you page asking whether its payment has been recorded, by the checkout session
 *   id the processor put in the return address (unguessable; the answer says only received or not, the
 *   amount and the branch).
 */
@ApiTags('payments')
@Controller('payments')
export class WebhookController {
  constructor(
    private readonly webhooks: WebhooksService,
    private readonly payments: PaymentsService,
  ) {}

  @Post('webhook')
  @Public()
  @HttpCode(200)
  @ApiOperation({ summary: 'The card processor’s signed events (Stripe-Signature over the raw body)' })
  async webhook(
    @Req() req: Request,
    @Res() res: Response,
    @Headers('stripe-signature') signature: string | undefined,
  ): Promise<void> {
    const { status, body, processMs } = await this.webhooks.receive(req.body, signature);
    // How long the event took once its signature was checked (the standard Server-Timing header).
    if (processMs !== undefined) res.setHeader('Server-Timing', `process;dur=${processMs.toFixed(3)}`);
    res.status(status).json(body);
  }

  @Get('checkout/:sessionId')
  @Public()
  @ApiOperation({ summary: 'Public: whether the payment of a checkout session has been recorded' })
  checkout(@Param('sessionId') sessionId: string): Promise<CheckoutStatus> {
    return this.payments.checkoutStatus(sessionId);
  }
}
