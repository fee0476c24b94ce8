import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A camber reading. Never edited or deleted: a correction is a new reading that supersedes this one. */
@Entity({ name: 'reading' })
export class Reading {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'plant_id' }) plantId!: string;
  @Column({ type: 'uuid', name: 'piece_id' }) pieceId!: string;
  @Column({ type: 'timestamptz', name: 'taken_at' }) takenAt!: Date;
  @Column({ type: 'timestamptz', name: 'received_at' }) receivedAt!: Date;
  /** Canonical value in millimetres, exact for sixteenths of an inch (1/16 in = 1.5875 mm). */
  @Column({ type: 'numeric', precision: 12, scale: 6, name: 'value_mm' }) valueMm!: string;
  @Column({ type: 'text', name: 'entered_text' }) enteredText!: string;
  @Column({ type: 'text', name: 'entered_unit' }) enteredUnit!: 'in' | 'mm';
  @Column({ type: 'text' }) method!: string;
  @Column({ type: 'text' }) support!: string;
  @Column({ type: 'numeric', precision: 10, scale: 3, name: 'overhang_mm', nullable: true }) overhangMm!: string | null;
  @Column({ type: 'numeric', precision: 5, scale: 1, name: 'air_temp_c', nullable: true }) airTempC!: string | null;
  @Column({ type: 'text', nullable: true }) sky!: string | null;
  @Column({ type: 'text', nullable: true }) note!: string | null;
  @Column({ type: 'uuid', name: 'taken_by' }) takenBy!: string;
  @Column({ type: 'text', name: 'idempotency_key' }) idempotencyKey!: string;
  @Column({ type: 'text', name: 'request_hash' }) requestHash!: string;
  @Column({ type: 'uuid', name: 'supersedes', nullable: true }) supersedes!: string | null;
  @Column({ type: 'uuid', name: 'superseded_by', nullable: true }) supersededBy!: string | null;
  @Column({ type: 'text', name: 'correction_reason', nullable: true }) correctionReason!: string | null;
}
