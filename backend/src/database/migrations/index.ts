import { CreateAccounts1764633600000 } from './1764633600000-CreateAccounts.js';
import { CreateLabRecords1764637200000 } from './1764637200000-CreateLabRecords.js';
import { CreateCertificates1764643600000 } from './1764643600000-CreateCertificates.js';
import { CreateStudiesAndAttachments1764654000000 } from './1764654000000-CreateStudiesAndAttachments.js';
import { AddReadingSortIndexes1764660000000 } from './1764660000000-AddReadingSortIndexes.js';
import { KeepSignedRecords1764700000000 } from './1764700000000-KeepSignedRecords.js';
import { AddReadingAuthors1764730000000 } from './1764730000000-AddReadingAuthors.js';
import { AddCertificateAsFoundDecision1764750000000 } from './1764750000000-AddCertificateAsFoundDecision.js';
import { AddUserTokenVersion1764820000000 } from './1764820000000-AddUserTokenVersion.js';
import { AddCounterCapture1764900000000 } from './1764900000000-AddCounterCapture.js';
import { AddRunCounters1764950000000 } from './1764950000000-AddRunCounters.js';
import { StoreFilesInDatabase1765000000000 } from './1765000000000-StoreFilesInDatabase.js';
import { AddPriceList1765100000000 } from './1765100000000-AddPriceList.js';
import { AddQuotes1765110000000 } from './1765110000000-AddQuotes.js';
import { AddInvoices1765120000000 } from './1765120000000-AddInvoices.js';
import { AddPayments1765130000000 } from './1765130000000-AddPayments.js';
import { AddRunDataKind1765140000000 } from './1765140000000-AddRunDataKind.js';

/** Every migration, oldest first. Listed as classes so jest (ESM) and the build load the same code. */
export const MIGRATIONS = [
  CreateAccounts1764633600000,
  CreateLabRecords1764637200000,
  CreateCertificates1764643600000,
  CreateStudiesAndAttachments1764654000000,
  AddReadingSortIndexes1764660000000,
  KeepSignedRecords1764700000000,
  AddReadingAuthors1764730000000,
  AddCertificateAsFoundDecision1764750000000,
  AddUserTokenVersion1764820000000,
  AddCounterCapture1764900000000,
  AddRunCounters1764950000000,
  StoreFilesInDatabase1765000000000,
  AddPriceList1765100000000,
  AddQuotes1765110000000,
  AddInvoices1765120000000,
  AddPayments1765130000000,
  AddRunDataKind1765140000000,
];
