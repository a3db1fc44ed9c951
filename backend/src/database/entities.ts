import { AuditEvent } from '../audit/audit-event.entity.js';
import { RevokedToken } from '../auth/revoked-token.entity.js';
import { Organization } from '../organizations/organization.entity.js';
import { User } from '../users/user.entity.js';

/**
 * Every entity, for the stand-alone data source (CLI, seed, benchmarks). Nest modules register their
 * own with forFeature and autoLoadEntities; this list exists only for code that runs outside Nest.
 */
export const ENTITIES = [Organization, User, AuditEvent, RevokedToken];
