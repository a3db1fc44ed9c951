import { Body, Controller, Get, Headers, HttpCode, Post, Query, Req, type RawBodyRequest } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { Request } from 'express';
import type { ListResponse, PayInvoiceResponse, Payment } from '@kilocycle/common/types';
import { BILLING_ROLES, LAB_ROLES } from '@kilocycle/common/rules';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Public, Roles } from '../shared/decorators.js';
import { IdParam } from '../shared/id-param.decorator.js';
import { ListPaymentsQueryDto, RefundPaymentDto } from './dto/payment.dto.js';
import { PaymentsService } from './payments.service.js';

@ApiTags('payments')
@ApiBearerAuth()
@Controller('payments')
export class PaymentsController {
  constructor(private readonly payments: PaymentsService) {}

  /** The payment service's events. No session: the signature on the raw body is the authentication. */
  @Public()
  @Post('webhook')
  @HttpCode(200)
  webhook(@Req() req: RawBodyRequest<Request>, @Headers('stripe-signature') signature: string | undefined): Promise<{ received: true; applied: boolean }> {
    return this.payments.webhook(req.rawBody, signature);
  }

  @Roles(...LAB_ROLES, 'client')
  @Get()
  list(@CurrentUser() user: AuthUser, @Query() query: ListPaymentsQueryDto): Promise<ListResponse<Payment>> {
    return this.payments.list(user, query);
  }

  @Roles(...LAB_ROLES, 'client')
  @Get(':id')
  one(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<Payment> {
    return this.payments.one(user, id);
  }

  /** Refunds all or part of a card payment; a credit note of the amount is raised with it. */
  @Roles(...BILLING_ROLES)
  @Post(':id/refund')
  refund(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: RefundPaymentDto): Promise<Payment> {
    return this.payments.refund(user, id, body.amountMinor, body.reason);
  }
}

@ApiTags('payments')
@ApiBearerAuth()
@Controller('invoices')
export class InvoicePaymentsController {
  constructor(private readonly payments: PaymentsService) {}

  /** Starts paying what is owed on an invoice by card: answers the payment page to send the browser to. */
  @Roles('client', ...BILLING_ROLES)
  @Post(':id/pay')
  pay(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<PayInvoiceResponse> {
    return this.payments.pay(user, id);
  }
}
