import { Controller, Get, HttpStatus, Res } from '@nestjs/common';
import { ApiTags } from '@nestjs/swagger';
import { InjectDataSource } from '@nestjs/typeorm';
import type { Response } from 'express';
import type { DataSource } from 'typeorm';
import type { HealthResponse } from '@kilocycle/common/types';
import { Public } from '../shared/decorators.js';

export const APP_VERSION = '0.1.0';

@ApiTags('health')
@Controller('health')
export class HealthController {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** 200 while the database answers, 503 while it does not; the pool reconnects by itself when it returns. */
  @Public()
  @Get()
  async check(@Res({ passthrough: true }) res: Response): Promise<HealthResponse> {
    let timer: NodeJS.Timeout | undefined;
    try {
      await Promise.race([
        this.dataSource.query('SELECT 1'),
        new Promise((_, reject) => {
          timer = setTimeout(() => reject(new Error('database did not answer in 3 s')), 3000);
        }),
      ]);
      return { status: 'ok', database: 'up', version: APP_VERSION };
    } catch {
      res.status(HttpStatus.SERVICE_UNAVAILABLE);
      return { status: 'degraded', database: 'down', version: APP_VERSION };
    } finally {
      clearTimeout(timer);
    }
  }
}
