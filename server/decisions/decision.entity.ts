import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A QC decision on a piece, append-only. */
@Entity({ name: 'decision' })
export class Decision {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'plant_id' }) plantId!: string;
  @Column({ type: 'uuid', name: 'piece_id' }) pieceId!: string;
  @Column({ type: 'text' }) kind!: string;
  @Column({ type: 'text' }) comment!: string;
  @Column({ type: 'uuid', name: 'decided_by' }) decidedBy!: string;
  @Column({ type: 'timestamptz', name: 'decided_at' }) decidedAt!: Date;
}
