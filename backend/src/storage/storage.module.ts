import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { FileStore } from './file-store.service.js';
import { StoredFile } from './stored-file.entity.js';

/** Files every app node reaches (certificate PDFs, attachments), kept in MariaDB; owns `stored_files`. */
@Module({
  imports: [TypeOrmModule.forFeature([StoredFile])],
  providers: [FileStore],
  exports: [FileStore],
})
export class StorageModule {}
