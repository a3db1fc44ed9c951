export const ORGANIZATION_KINDS = ['lab', 'customer'] as const;
export type OrganizationKind = (typeof ORGANIZATION_KINDS)[number];

export type Organization = {
  id: number;
  name: string;
  kind: OrganizationKind;
  contactEmail: string | null;
  active: boolean;
  createdAt: string;
};

export type CreateOrganizationRequest = {
  name: string;
  kind: OrganizationKind;
  contactEmail?: string | null;
};

export type UpdateOrganizationRequest = Partial<CreateOrganizationRequest> & { active?: boolean };
