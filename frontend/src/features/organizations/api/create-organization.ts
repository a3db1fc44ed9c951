import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateOrganizationRequest, Organization } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { looksLikeEmail } from '@/utils/validation';
import { getOrganizationsQueryOptions } from './get-organizations';

export type CreateOrganizationErrors = Partial<Record<keyof CreateOrganizationRequest, string>>;

export function validateCreateOrganization(input: CreateOrganizationRequest): CreateOrganizationErrors {
  const errors: CreateOrganizationErrors = {};
  if (!input.name.trim()) errors.name = 'Enter the organisation’s name';
  const email = input.contactEmail?.trim();
  if (email && !looksLikeEmail(email)) errors.contactEmail = 'Enter a valid e-mail address, or leave it empty';
  return errors;
}

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
