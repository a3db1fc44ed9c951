import { Controller } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';

@ApiTags('prices')
@ApiBearerAuth()
@Controller('prices')
export class PricesController {}
