import { Injectable } from '@nestjs/common';

/** Placeholder until the routes land (next commit). */
@Injectable()
export class PricesService {}
