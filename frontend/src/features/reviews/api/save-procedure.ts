import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS } from '@kilocycle/common/rules';
import {
  CAPTURE_LIMITS,
  COMPONENT_DISTRIBUTIONS,
  DECISION_RULES,
  type CreateProcedureRequest,
  type ExtraComponent,
  type Procedure,
  type UpdateProcedureRequest,
} from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';
import { proceduresQueryKey } from './get-procedures';

/** An extra budget component as its row in the editor holds it: every number as typed. */
export const extraComponentDraftSchema = z.object({
  name: z.string(),
  distribution: z.enum(COMPONENT_DISTRIBUTIONS),
  value: z.string(),
  unit: z.enum(['Hz', 'ppm']),
  divisor: z.string(),
  dof: z.string(),
});
export type ExtraComponentDraft = z.infer<typeof extraComponentDraftSchema>;

/** The editor's rows as the API takes them; a refusal names the row ("Extra component 2: …"). */
export const extraComponentsSchema = z.array(extraComponentDraftSchema).transform((drafts, context) => {
  const components: ExtraComponent[] = [];
  for (const [index, d] of drafts.entries()) {
    const refuse = (problem: string) => context.addIssue({ code: 'custom', message: `Extra component ${index + 1}: ${problem}` });
    const value = Number(d.value);
    const divisor = Number(d.divisor);
    const dof = Number(d.dof);
    if (!d.name.trim()) refuse('give it a name');
    else if (d.value.trim() === '' || !Number.isFinite(value) || value < 0) refuse('the value must be a number of zero or more');
    else if (d.distribution === 'normal' && d.divisor.trim() !== '' && !(Number.isFinite(divisor) && divisor >= 0.001))
      refuse('the coverage factor must be a positive number');
    else if (d.dof.trim() !== '' && !(Number.isFinite(dof) && dof >= 1)) refuse('degrees of freedom must be 1 or more (leave empty for infinite)');
    else
      components.push({
        name: d.name.trim(),
        distribution: d.distribution,
        value,
        unit: d.unit,
        ...(d.distribution === 'normal' && d.divisor.trim() !== '' ? { divisor } : {}),
        ...(d.dof.trim() !== '' ? { dof } : {}),
      });
  }
  return components;
});

/** Dial marks as typed: numbers separated by commas, semicolons or spaces (a decimal point, not a comma). */
export function parseDialMarks(text: string): number[] | null {
  const parts = text.split(/[\s,;]+/).filter((part) => part !== '');
  const marks = parts.map(Number);
  return marks.every((m) => Number.isFinite(m)) ? marks : null;
}

const figure = (message: string, max = Infinity) =>
  z
    .string()
    .refine((text) => text.trim() !== '' && Number.isFinite(Number(text)) && Number(text) >= 0 && Number(text) <= max, message)
    .transform(Number);
const { settleCount, toleranceHz, timeoutS } = CAPTURE_LIMITS;
const between = ({ min, max }: { min: number; max: number }, integer: boolean, message: string) =>
  z
    .string()
    .refine((text) => {
      const n = Number(text);
      return text.trim() !== '' && (integer ? Number.isInteger(n) : Number.isFinite(n)) && n >= min && n <= max;
    }, message)
    .transform(Number);
const LIMITS = FIELD_LIMITS.procedure;

/** The procedure form (new and edit; `active` is only sent by the edit). */
export const procedureSchema = z.object({
  name: z.string().trim().min(1, 'Give the procedure a name').max(LIMITS.name.max, `At most ${LIMITS.name.max} characters`),
  method: z.string().trim().min(1, 'Give the method text').max(LIMITS.method.max, `At most ${LIMITS.method.max} characters`),
  decisionRule: z.enum(DECISION_RULES),
  dialHalfDivisionPercentOfSpan: figure('A number from 0 to 50 % of the span', LIMITS.dialHalfDivisionPercentOfSpan.max),
  driftPpm: figure('A number of zero or more'),
  driftHz: figure('A number of zero or more'),
  extraComponents: extraComponentsSchema,
  isDefault: z.boolean(),
  active: z.boolean(),
  captureSettleCount: between(settleCount, true, `Readings that must agree: a whole number from ${settleCount.min} to ${settleCount.max}`),
  captureToleranceHz: between(toleranceHz, false, `Settle band: a number of Hz from ${toleranceHz.min} to ${toleranceHz.max}`),
  captureTimeoutS: between(timeoutS, true, `Timeout: a whole number of seconds from ${timeoutS.min} to ${timeoutS.max}`),
  dialMarks: z.string().transform((text, context) => {
    const marks = parseDialMarks(text);
    if (!marks) context.addIssue({ code: 'custom', message: 'Dial marks: numbers separated by commas or spaces (a decimal point, e.g. 1750, 1800.5)' });
    else if (marks.length > CAPTURE_LIMITS.dialMarks.max) context.addIssue({ code: 'custom', message: `Dial marks: at most ${CAPTURE_LIMITS.dialMarks.max}` });
    return marks ?? [];
  }),
}) satisfies z.ZodType<CreateProcedureRequest & { active: boolean }, unknown>;

export type SaveProcedureInput = { id: null; changes: CreateProcedureRequest } | { id: number; changes: UpdateProcedureRequest };

export function saveProcedure(input: SaveProcedureInput): Promise<Procedure> {
  return input.id === null
    ? api.post<Procedure>('/procedures', input.changes, { notify: false })
    : api.patch<Procedure>(`/procedures/${input.id}`, input.changes, { notify: false });
}

export function useSaveProcedure({ onSuccess }: { onSuccess?: (procedure: Procedure) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveProcedure,
    onSuccess: async (procedure) => {
      // Every procedure list, and every result computed from a procedure's defaults.
      await queryClient.invalidateQueries({ queryKey: proceduresQueryKey });
      await queryClient.invalidateQueries({ queryKey: sharedQueryKeys.reviews });
      onSuccess?.(procedure);
    },
  });
}
