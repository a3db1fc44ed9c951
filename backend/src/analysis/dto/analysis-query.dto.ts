import { Type } from 'class-transformer';
import { IsBoolean, IsIn, IsNumber, IsOptional, Matches, Max, MaxLength, Min } from 'class-validator';
import {
  STABILITY_DRIFT_CHOICES,
  STABILITY_FACTOR_SPACINGS,
  STABILITY_GAP_CHOICES,
  type RunAnalysisQuery,
  type StabilityDriftChoice,
  type StabilityFactorSpacing,
  type StabilityGapChoice,
} from '@kilocycle/common/types';
import { QueryBoolean } from '../../shared/dto-helpers.js';

const finite = { allowNaN: false, allowInfinity: false } as const;

export class RunAnalysisQueryDto implements RunAnalysisQuery {
  @IsOptional()
  @Type(() => Number)
  @IsNumber(finite, { message: 'tuningCapLowPf must be a number (pF)' })
  @Min(0.001, { message: 'tuningCapLowPf must be greater than zero' })
  @Max(1e6)
  tuningCapLowPf?: number;

  @IsOptional()
  @Type(() => Number)
  @IsNumber(finite, { message: 'withinHz must be a number (Hz)' })
  @Min(1e-9, { message: 'withinHz must be greater than zero' })
  withinHz?: number;

  @IsOptional()
  @Type(() => Number)
  @IsNumber(finite, { message: 'rateHzPerMin must be a number (Hz/min)' })
  @Min(1e-9, { message: 'rateHzPerMin must be greater than zero' })
  rateHzPerMin?: number;

  @IsOptional()
  @Type(() => Number)
  @IsNumber(finite, { message: 'windowSeconds must be a number (s)' })
  @Min(1, { message: 'windowSeconds must be at least 1' })
  @Max(31 * 86400)
  windowSeconds?: number;

  @IsOptional()
  @QueryBoolean()
  @IsBoolean({ message: 'linear must be true or false' })
  linear?: boolean;

  @IsOptional()
  @Type(() => Number)
  @IsNumber(finite, { message: 'referenceHz must be a number (Hz)' })
  @Min(1e-3, { message: 'referenceHz must be greater than zero' })
  referenceHz?: number;

  @IsOptional()
  @MaxLength(400)
  @Matches(/^[1-9]\d{0,8}(,[1-9]\d{0,8})*$/, { message: 'm: averaging factors are positive whole numbers separated by commas, e.g. 1,10,100' })
  m?: string;

  @IsOptional()
  @IsIn(STABILITY_FACTOR_SPACINGS, { message: `factors must be one of ${STABILITY_FACTOR_SPACINGS.join(', ')}` })
  factors?: StabilityFactorSpacing;

  @IsOptional()
  @IsIn(STABILITY_DRIFT_CHOICES, { message: `drift must be one of ${STABILITY_DRIFT_CHOICES.join(', ')}` })
  drift?: StabilityDriftChoice;

  @IsOptional()
  @IsIn(STABILITY_GAP_CHOICES, { message: `gaps must be one of ${STABILITY_GAP_CHOICES.join(', ')}` })
  gaps?: StabilityGapChoice;
}
