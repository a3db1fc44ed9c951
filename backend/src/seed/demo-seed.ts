import bcrypt from 'bcryptjs';
import type { DataSource, EntityManager } from 'typeorm';
import type { Role } from '@kilocycle/common/types';
import type { AppConfig } from '../config/app-config.js';
import { checkEnvironment } from '../config/env-schema.js';
import { Organization } from '../organizations/organization.entity.js';
import { passwordProblem } from '../users/password-policy.js';
import { User } from '../users/user.entity.js';
import { DEMO_EXTENSIONS } from './demo-extensions.js';

export const DEMO_PASSWORD = 'kilocycle-demo';
export const DEMO_LAB = 'Quarry Lane Frequency Lab';
export const DEMO_CUSTOMERS = {
  northgate: 'Northgate Radio Club',
  saltmarsh: 'Saltmarsh Restoration Works',
} as const;

export const DEMO_ACCOUNTS: ReadonlyArray<{ email: string; name: string; role: Role; org: 'lab' | keyof typeof DEMO_CUSTOMERS }> = [
  { email: 'admin@kilocycle.test', name: 'Ada Marsh', role: 'admin', org: 'lab' },
  { email: 'lead@kilocycle.test', name: 'Lena Brandt', role: 'lead', org: 'lab' },
  { email: 'tech@kilocycle.test', name: 'Tomas Reyes', role: 'technician', org: 'lab' },
  { email: 'engineer@kilocycle.test', name: 'Ellis Okafor', role: 'engineer', org: 'lab' },
  { email: 'client@northgate.test', name: 'Nora Quist', role: 'client', org: 'northgate' },
  { email: 'client@saltmarsh.test', name: 'Sam Pryce', role: 'client', org: 'saltmarsh' },
];

export type DemoContext = {
  manager: EntityManager;
  labId: number;
  customerIds: Record<keyof typeof DEMO_CUSTOMERS, number>;
  userIds: Record<string, number>;
};

export type DemoExtension = (context: DemoContext) => Promise<void>;

/**
 * Loads the invented demo scenario once. Running it again changes nothing: it returns false when the
 * lab organisation is already there. Everything is written in one transaction.
 */
export async function seedDemo(dataSource: DataSource, config: Pick<AppConfig, 'bcryptCost'>): Promise<boolean> {
  return dataSource.transaction(async (manager) => {
    if (await manager.existsBy(Organization, { name: DEMO_LAB })) return false;
    const insertOrg = async (name: string, kind: 'lab' | 'customer', contactEmail: string | null) =>
      (await manager.insert(Organization, { name, kind, contactEmail })).identifiers[0].id as number;
    const labId = await insertOrg(DEMO_LAB, 'lab', 'bench@quarrylane.test');
    const customerIds = {
      northgate: await insertOrg(DEMO_CUSTOMERS.northgate, 'customer', 'secretary@northgate.test'),
      saltmarsh: await insertOrg(DEMO_CUSTOMERS.saltmarsh, 'customer', 'workshop@saltmarsh.test'),
    };
    const passwordHash = await bcrypt.hash(DEMO_PASSWORD, config.bcryptCost);
    const userIds: Record<string, number> = {};
    for (const account of DEMO_ACCOUNTS) {
      const organizationId = account.org === 'lab' ? labId : customerIds[account.org];
      const result = await manager.insert(User, { email: account.email, name: account.name, role: account.role, organizationId, passwordHash });
      userIds[account.email] = result.identifiers[0].id as number;
    }
    for (const extend of DEMO_EXTENSIONS) await extend({ manager, labId, customerIds, userIds });
    return true;
  });
}

const ADMIN_NAME = 'Administrator';

/** Production start: makes sure an admin exists, from KC_ADMIN_EMAIL / KC_ADMIN_PASSWORD. */
export async function ensureAdmin(dataSource: DataSource, config: AppConfig, email: string): Promise<boolean> {
  if (!config.adminPassword) throw new Error('KC_ADMIN_PASSWORD must be set in production mode');
  return dataSource.transaction(async (manager) => {
    if (await manager.existsBy(User, { role: 'admin' })) return false;
    // The same policy as every other account's password (the demo password is set directly and need not pass).
    const problem = passwordProblem(config.adminPassword!, { name: ADMIN_NAME, email });
    if (problem) throw new Error(`KC_ADMIN_PASSWORD is refused: ${problem}`);
    let lab = await manager.findOneBy(Organization, { kind: 'lab' });
    if (!lab) {
      const id = (
        await manager.insert(Organization, { name: checkEnvironment(process.env).values.KC_LAB_NAME ?? 'Calibration Lab', kind: 'lab', contactEmail: null })
      ).identifiers[0].id as number;
      lab = await manager.findOneByOrFail(Organization, { id });
    }
    const passwordHash = await bcrypt.hash(config.adminPassword!, config.bcryptCost);
    await manager.insert(User, { email: email.toLowerCase(), name: ADMIN_NAME, role: 'admin', organizationId: lab.id, passwordHash });
    return true;
  });
}
