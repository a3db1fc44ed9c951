import { Inject, Injectable, Logger, type OnModuleInit } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { existsSync } from 'node:fs';
import type { DataSource } from 'typeorm';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';
import { loadSigningKey, signingKeyPath } from './signing-key.js';

/**
 * The key is made lazily on first use. That is right on a first start, and wrong after a database was
 * restored without var/keys: a new key would make every issued certificate fail its public check. So at
 * start, if any certificate carries a signature and the key file is missing, the app refuses to start.
 */
@Injectable()
export class SigningKeyCheck implements OnModuleInit {
  private readonly logger = new Logger('Certificates');

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
  ) {}

  async onModuleInit(): Promise<void> {
    // A database not migrated yet holds no certificates (the health check may run on one).
    const [table]: Array<{ n: string | number }> = await this.dataSource.query(
      "SELECT COUNT(*) AS n FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name = 'certificates'",
    );
    if (Number(table?.n ?? 0) === 0) return;
    const rows: { keyId: string | null; n: string | number }[] = await this.dataSource.query(
      'SELECT key_id AS keyId, COUNT(*) AS n FROM certificates WHERE signature IS NOT NULL GROUP BY key_id',
    );
    const signed = rows.reduce((sum, r) => sum + Number(r.n), 0);
    if (signed === 0) return;
    const keyIds = rows.map((r) => r.keyId ?? 'none').join(', ');
    const privatePath = signingKeyPath(this.config);
    if (!existsSync(privatePath)) {
      throw new Error(
        `${signed} issued certificate(s) in database ${this.config.db.name} were signed with key ${keyIds}, but the signing key ` +
          `${privatePath} is missing. Kilocycle will not make a new key: every issued certificate would then fail its check. ` +
          'Restore var/keys from your backup: bin/kilocycle restore --keys-only ARCHIVE (or the whole backup: bin/kilocycle restore ARCHIVE), then start again.',
      );
    }
    const key = loadSigningKey(this.config);
    const others = rows.filter((r) => r.keyId !== key.keyId).reduce((sum, r) => sum + Number(r.n), 0);
    if (others > 0) {
      this.logger.warn(
        `${others} issued certificate(s) were signed with another key than ${key.keyId} (${keyIds}); their public check will fail. ` +
          'If var/keys was replaced, restore it from the backup (bin/kilocycle restore --keys-only ARCHIVE).',
      );
    }
  }
}
