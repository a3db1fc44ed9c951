import { Column, Entity, PrimaryColumn } from 'typeorm';

export type DocumentSequenceName = 'invoice' | 'credit_note';

/**
 * The next number of each numbered document. The issuing transaction locks its row (SELECT … FOR UPDATE), takes
 * the value and moves it on, so two issues at once queue on the row and a rolled-back issue gives its number back:
 * numbers never skip or repeat.
 */
@Entity('document_sequences')
export class DocumentSequence {
  @PrimaryColumn({ type: 'varchar', length: 32 })
  name: DocumentSequenceName;

  @Column({ name: 'next_value', type: 'int', default: 1 })
  nextValue: number;
}
