import type { EntityManager } from 'typeorm';
import type { DocumentSequenceName } from './document-sequence.entity.js';

const PREFIX: Record<DocumentSequenceName, string> = { invoice: 'INV-', credit_note: 'CN-' };

/**
 * The next number of a document (INV-000001, CN-000001), taken in the caller's transaction: the sequence's row is
 * locked FOR UPDATE until that transaction ends, so concurrent issues queue on it and each gets the next value; a
 * transaction that rolls back gives its number back with the row. Gap-free and never repeated.
 */
export async function takeDocumentNumber(manager: EntityManager, name: DocumentSequenceName): Promise<string> {
  if (!manager.queryRunner?.isTransactionActive) throw new Error('a document number is taken inside the transaction that issues the document');
  const rows: Array<{ next_value: number | string }> = await manager.query('SELECT next_value FROM document_sequences WHERE name = ? FOR UPDATE', [name]);
  if (!rows[0]) throw new Error(`document sequence "${name}" is missing (migration AddInvoices seeds it)`);
  const value = Number(rows[0].next_value);
  await manager.query('UPDATE document_sequences SET next_value = ? WHERE name = ?', [value + 1, name]);
  return `${PREFIX[name]}${String(value).padStart(6, '0')}`;
}
