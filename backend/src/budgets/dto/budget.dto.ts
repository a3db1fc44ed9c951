import { Transform, Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsBoolean,
  IsIn,
  IsInt,
  IsNumber,
  IsOptional,
  IsString,
  Max,
  MaxLength,
  Min,
  MinLength,
  ValidateIf,
  ValidateNested,
} from 'class-validator';
import {
  CAPTURE_LIMITS,
  COMPONENT_DISTRIBUTIONS,
  DECISION_RULES,
  type ComponentDistribution,
  type CreateProcedureRequest,
  type DecisionRule,
  type ExtraComponent,
  type ListProceduresQuery,
  type SetJobProcedureRequest,
  type UpdateProcedureRequest,
  type UpdateRunBudgetRequest,
} from '@kilocycle/common/types';
import { ListQueryDto } from '../../shared/list-query.dto.js';
import { SingleLine } from '../../shared/single-line.decorator.js';
import { OptionalNotNull } from '../../shared/optional-not-null.decorator.js';
import { PartialUpdateType } from '../../shared/partial-update-type.js';

export class ExtraComponentDto implements ExtraComponent {
  @IsString()
  @MinLength(1)
  @MaxLength(120)
  @SingleLine()
  name: string;

  @IsIn(COMPONENT_DISTRIBUTIONS, { message: `distribution must be one of: ${COMPONENT_DISTRIBUTIONS.join(', ')}` })
  distribution: ComponentDistribution;

  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(0)
  value: number;

  @IsIn(['Hz', 'ppm'], { message: 'unit must be Hz or ppm' })
  unit: 'Hz' | 'ppm';

  @OptionalNotNull()
  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(0.001)
  divisor?: number;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(1)
  dof?: number | null;
}

export class CreateProcedureDto implements CreateProcedureRequest {
  @IsString()
  @MinLength(1)
  @MaxLength(120)
  @SingleLine()
  name: string;

  @IsString()
  @MinLength(1)
  @MaxLength(4000)
  method: string;

  @IsIn(DECISION_RULES, { message: `decisionRule must be one of: ${DECISION_RULES.join(', ')}` })
  decisionRule: DecisionRule;

  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(0)
  @Max(50)
  dialHalfDivisionPercentOfSpan: number;

  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(0)
  driftPpm: number;

  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(0)
  driftHz: number;

  @IsArray()
  @ValidateNested({ each: true })
  @Type(() => ExtraComponentDto)
  extraComponents: ExtraComponentDto[];

  @OptionalNotNull()
  @IsBoolean()
  isDefault?: boolean;

  @OptionalNotNull() @IsInt() @Min(CAPTURE_LIMITS.settleCount.min) @Max(CAPTURE_LIMITS.settleCount.max) captureSettleCount?: number;
  @OptionalNotNull()
  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(CAPTURE_LIMITS.toleranceHz.min)
  @Max(CAPTURE_LIMITS.toleranceHz.max)
  captureToleranceHz?: number;
  @OptionalNotNull() @IsInt() @Min(CAPTURE_LIMITS.timeoutS.min) @Max(CAPTURE_LIMITS.timeoutS.max) captureTimeoutS?: number;
  @OptionalNotNull()
  @IsArray()
  @ArrayMaxSize(CAPTURE_LIMITS.dialMarks.max)
  @IsNumber({ allowNaN: false, allowInfinity: false }, { each: true })
  @Min(-1e9, { each: true })
  @Max(1e9, { each: true })
  dialMarks?: number[];
}

export class UpdateProcedureDto extends PartialUpdateType(CreateProcedureDto) implements UpdateProcedureRequest {
  @OptionalNotNull() @IsBoolean() active?: boolean;
}

export class ListProceduresQueryDto extends ListQueryDto implements ListProceduresQuery {
  @IsOptional()
  @Transform(({ value }) => (value === 'true' ? true : value === 'false' ? false : value))
  @IsBoolean()
  active?: boolean;
}

export class SetJobProcedureDto implements SetJobProcedureRequest {
  @IsInt()
  @Min(1)
  procedureId: number;
}

const nullableNumber = () => ValidateIf((_o, v) => v !== null);

export class UpdateRunBudgetDto implements UpdateRunBudgetRequest {
  @IsOptional() @nullableNumber() @IsNumber({ allowNaN: false, allowInfinity: false }) @Min(0) dialHalfDivision?: number | null;
  @IsOptional() @nullableNumber() @IsNumber({ allowNaN: false, allowInfinity: false }) @Min(0) driftPpm?: number | null;
  @IsOptional() @nullableNumber() @IsNumber({ allowNaN: false, allowInfinity: false }) @Min(0) driftHz?: number | null;
  @IsOptional() @nullableNumber() @IsNumber({ allowNaN: false, allowInfinity: false }) @Min(0) counterResolutionHz?: number | null;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsArray()
  @ValidateNested({ each: true })
  @Type(() => ExtraComponentDto)
  extraComponents?: ExtraComponentDto[] | null;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsString()
  @MaxLength(2000)
  note?: string | null;
}
