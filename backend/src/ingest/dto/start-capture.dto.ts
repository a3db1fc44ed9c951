import { IsDefined } from 'class-validator';
import type { StartCaptureRequest } from '@kilocycle/common/types';

/** POST /api/runs/:runId/capture. The dial is read (number or text) and checked against the range by the service. */
export class StartCaptureDto implements StartCaptureRequest {
  @IsDefined({ message: 'dial: a dial setting is required (a number, or text such as "1750")' })
  dial: number | string;
}
