import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { DialLaw, DialUnit, Tolerance } from '@kilocycle/common/types';
import { Instrument } from './instrument.entity.js';

/** One switch position of an instrument. */
@Entity('instrument_ranges')
@Index('UQ_instrument_ranges_position', ['instrumentId', 'position'], { unique: true })
export class InstrumentRange {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'instrument_id', type: 'int' })
  instrumentId: number;

  @ManyToOne(() => Instrument, (instrument) => instrument.ranges, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'instrument_id', foreignKeyConstraintName: 'FK_instrument_ranges_instrument' })
  instrument: Relation<Instrument>;

  @Column({ type: 'int' })
  position: number;

  @Column({ type: 'varchar', length: 60 })
  label: string;

  @Column({ name: 'dial_unit', type: 'varchar', length: 8 })
  dialUnit: DialUnit;

  @Column({ name: 'dial_law', type: 'json' })
  dialLaw: DialLaw;

  @Column({ name: 'dial_min', type: 'double' })
  dialMin: number;

  @Column({ name: 'dial_max', type: 'double' })
  dialMax: number;

  @Column({ name: 'freq_min_hz', type: 'double' })
  freqMinHz: number;

  @Column({ name: 'freq_max_hz', type: 'double' })
  freqMaxHz: number;

  @Column({ type: 'json' })
  tolerance: Tolerance;

  @Column({ type: 'json' })
  multipliers: number[];
}
