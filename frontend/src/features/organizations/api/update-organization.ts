import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Organization, UpdateOrganizationRequest } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getOrganizationsQueryOptions } from './get-organizations';

export type UpdateOrganizationInput = { id: number; changes: UpdateOrganizationRequest };

export function updateOrganization({ id, changes }: UpdateOrganizationInput): Promise<Organization> {
  return api.patch<Organization>(`/organizations/${id}`, changes);
}

type UseUpdateOrganizationOptions = { onSuccess?: (organization: Organization) => void };

export function useUpdateOrganization({ onSuccess }: UseUpdateOrganizationOptions = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateOrganization,
    onSuccess: async (organization) => {
      await queryClient.invalidateQueries({ queryKey: getOrganizationsQueryOptions().queryKey });
      onSuccess?.(organization);
    },
  });
}
