import { Controller, Get, Inject } from '@nestjs/common';
import { ApiTags } from '@nestjs/swagger';
import {
  HealthCheck,
  HealthCheckService,
  HealthIndicatorService,
  TypeOrmHealthIndicator,
  type HealthCheckResult,
  type HealthIndicatorFunction,
} from '@nestjs/terminus';
import { SharedRedis } from '../cluster/cluster.module.js';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';
import { Public } from '../shared/decorators.js';

/**
 * Liveness and readiness through @nestjs/terminus, for a load balancer in front of several nodes:
 * `live` answers while the process does; `ready` answers 200 only while MariaDB and, in cluster mode,
 * Redis answer (503 otherwise, with which part is down), so the balancer stops routing to a node that
 * could not finish a request.
 */
@ApiTags('health')
@Controller('health')
export class ReadinessController {
  constructor(
    private readonly health: HealthCheckService,
    private readonly database: TypeOrmHealthIndicator,
    private readonly indicators: HealthIndicatorService,
    private readonly redis: SharedRedis,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
  ) {}

  @Public()
  @Get('live')
  @HealthCheck()
  live(): Promise<HealthCheckResult> {
    return this.health.check([]);
  }

  @Public()
  @Get('ready')
  @HealthCheck()
  ready(): Promise<HealthCheckResult> {
    const checks: HealthIndicatorFunction[] = [() => this.database.pingCheck('database', { timeout: 3000 })];
    // Which node answered (KC_NODE_NAME), for whoever reads the balancer's checks.
    if (this.config.nodeName) checks.push(() => this.indicators.check('node').up({ name: this.config.nodeName }));
    if (this.redis.enabled) {
      checks.push(async () => {
        const redis = this.indicators.check('redis');
        try {
          await this.redis.ping();
          return redis.up();
        } catch (error) {
          return redis.down({ message: error instanceof Error ? error.message : String(error) });
        }
      });
    }
    return this.health.check(checks);
  }
}
