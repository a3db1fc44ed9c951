import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { InvoicesModule } from '../invoices/invoices.module.js';
import { PaymentEvent } from './payment-event.entity.js';
import { PaymentGateway } from './payment-gateway.js';
import { Payment } from './payment.entity.js';
import { InvoicePaymentsController, PaymentsController } from './payments.controller.js';
import { PaymentsService } from './payments.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([Payment, PaymentEvent]), InvoicesModule],
  controllers: [PaymentsController, InvoicePaymentsController],
  providers: [PaymentGateway, PaymentsService],
})
export class PaymentsModule {}
