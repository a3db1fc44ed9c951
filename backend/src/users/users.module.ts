import { Global, Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { OrganizationsModule } from '../organizations/organizations.module.js';
import { AccountSessions } from '../shared/account-sessions.js';
import { ActorDirectory } from '../shared/actor-directory.js';
import { AccountsReader } from './accounts.reader.js';
import { ActorNamesReader } from './actor-names.reader.js';
import { CertificateRecipientsReader } from './certificate-recipients.reader.js';
import { SessionsService } from './sessions.service.js';
import { UsersController } from './users.controller.js';
import { UsersService } from './users.service.js';
import { User } from './user.entity.js';

// Global: the modules that end or follow sessions (auth, organizations, live) inject AccountSessions, and
// the audit log ActorDirectory, without importing this module, so the users module imports none of them back.
@Global()
@Module({
  imports: [TypeOrmModule.forFeature([User]), OrganizationsModule],
  controllers: [UsersController],
  providers: [
    UsersService,
    SessionsService,
    AccountsReader,
    ActorNamesReader,
    CertificateRecipientsReader,
    { provide: AccountSessions, useExisting: SessionsService },
    { provide: ActorDirectory, useExisting: ActorNamesReader },
  ],
  exports: [UsersService, AccountsReader, AccountSessions, ActorDirectory, CertificateRecipientsReader],
})
export class UsersModule {}
