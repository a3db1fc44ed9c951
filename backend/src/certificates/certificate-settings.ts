import type { EntityManager } from 'typeorm';
import type { CertificateSettings } from '@kilocycle/common/types';
import { checkEnvironment } from '../config/config.module.js';
import { Setting } from './setting.entity.js';

/** Defaults until an admin changes them; the first three may come from the environment. */
export function defaultSettings(env: NodeJS.ProcessEnv = process.env): CertificateSettings {
  // Through the settings schema: a prefix or address it refuses stopped the start already.
  const { values } = checkEnvironment(env);
  return {
    allowSelfSign: false,
    certificatePrefix: values.KC_CERT_PREFIX ?? 'QL',
    labAddress: values.KC_LAB_ADDRESS ?? 'Address not set: an admin enters it under Settings',
    calibrationPlace: "At the laboratory's permanent premises",
    recallNoticeDays: 30,
  };
}

export const SETTING_KEYS = Object.keys(defaultSettings({})) as Array<keyof CertificateSettings>;

export async function readSettings(manager: EntityManager): Promise<CertificateSettings> {
  const rows = await manager.find(Setting);
  const settings = defaultSettings();
  for (const row of rows) {
    if ((SETTING_KEYS as string[]).includes(row.key)) Object.assign(settings, { [row.key]: row.value });
  }
  return settings;
}

export async function writeSettings(manager: EntityManager, patch: Partial<CertificateSettings>, actorId: number | null): Promise<void> {
  for (const [key, value] of Object.entries(patch)) {
    if (value === undefined) continue;
    await manager.upsert(Setting, { key, value, updatedById: actorId }, ['key']);
  }
}
