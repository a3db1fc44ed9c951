import { Body, Controller, Get, Patch, Post, Put, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { CustomerTerms, ListResponse, PriceItem, PriceItemsResponse, TaxRate } from '@kilocycle/common/types';
import { BILLING_ROLES, LAB_ROLES } from '@kilocycle/common/rules';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Roles } from '../shared/decorators.js';
import { IdParam } from '../shared/id-param.decorator.js';
import { ListQueryDto } from '../shared/list-query.dto.js';
import {
  CreatePriceItemDto,
  CreateTaxRateDto,
  ListPriceItemsQueryDto,
  ListTaxRatesQueryDto,
  UpdateCustomerTermsDto,
  UpdatePriceItemDto,
  UpdateTaxRateDto,
} from './dto/prices.dto.js';
import { PricesService } from './prices.service.js';

/** The price list, tax rates and customer terms: the lab reads them, admin and lead change them. */
@ApiTags('prices')
@ApiBearerAuth()
@Controller('prices')
export class PricesController {
  constructor(private readonly prices: PricesService) {}

  @Roles(...LAB_ROLES)
  @Get('items')
  listItems(@Query() query: ListPriceItemsQueryDto): Promise<PriceItemsResponse> {
    return this.prices.listItems(query);
  }

  @Roles(...BILLING_ROLES)
  @Post('items')
  createItem(@CurrentUser() user: AuthUser, @Body() body: CreatePriceItemDto): Promise<PriceItem> {
    return this.prices.createItem(user, body);
  }

  @Roles(...BILLING_ROLES)
  @Patch('items/:id')
  updateItem(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: UpdatePriceItemDto): Promise<PriceItem> {
    return this.prices.updateItem(user, id, body);
  }

  @Roles(...LAB_ROLES)
  @Get('tax-rates')
  listTaxRates(@Query() query: ListTaxRatesQueryDto): Promise<ListResponse<TaxRate>> {
    return this.prices.listTaxRates(query);
  }

  @Roles(...BILLING_ROLES)
  @Post('tax-rates')
  createTaxRate(@CurrentUser() user: AuthUser, @Body() body: CreateTaxRateDto): Promise<TaxRate> {
    return this.prices.createTaxRate(user, body);
  }

  @Roles(...BILLING_ROLES)
  @Patch('tax-rates/:id')
  updateTaxRate(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: UpdateTaxRateDto): Promise<TaxRate> {
    return this.prices.updateTaxRate(user, id, body);
  }

  @Roles(...LAB_ROLES)
  @Get('customer-terms')
  listTerms(@Query() query: ListQueryDto): Promise<ListResponse<CustomerTerms>> {
    return this.prices.listTerms(query);
  }

  /** Also a client, for its own organisation. */
  @Get('customer-terms/:organizationId')
  getTerms(@CurrentUser() user: AuthUser, @IdParam('organizationId') organizationId: number): Promise<CustomerTerms> {
    return this.prices.getTerms(user, organizationId);
  }

  @Roles(...BILLING_ROLES)
  @Put('customer-terms/:organizationId')
  putTerms(@CurrentUser() user: AuthUser, @IdParam('organizationId') organizationId: number, @Body() body: UpdateCustomerTermsDto): Promise<CustomerTerms> {
    return this.prices.putTerms(user, organizationId, body);
  }
}
