import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS } from '@kilocycle/common/rules';
import { ORGANIZATION_KINDS, type CreateOrganizationRequest, type Organization } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { looksLikeEmail } from '@/utils/validation';
import { getOrganizationsQueryOptions } from './get-organizations';

/** The new-organisation form: checked before sending; the server checks again and its messages are shown as they come. */
export const createOrganizationSchema = z
  .object({
    name: z
      .string()
      .trim()
      .min(1, 'Enter the organisation’s name')
      .max(FIELD_LIMITS.organization.name.max, `At most ${FIELD_LIMITS.organization.name.max} characters`),
    kind: z.enum(ORGANIZATION_KINDS),
    contactEmail: z
      .string()
      .trim()
      .refine((email) => !email || looksLikeEmail(email), 'Enter a valid e-mail address, or leave it empty'),
  })
  .transform(({ contactEmail, ...rest }): CreateOrganizationRequest => ({ ...rest, ...(contactEmail ? { contactEmail } : {}) }));

export function createOrganization(body: CreateOrganizationRequest): Promise<Organization> {
  return api.post<Organization>('/organizations', body, { notify: false });
}

type UseCreateOrganizationOptions = { onSuccess?: (organization: Organization) => void };

export function useCreateOrganization({ onSuccess }: UseCreateOrganizationOptions = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createOrganization,
    onSuccess: async (organization) => {
      await queryClient.invalidateQueries({ queryKey: getOrganizationsQueryOptions().queryKey });
      onSuccess?.(organization);
    },
  });
}
