import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';
import type { PieceStatus } from '#shared/api/pieces';

@Entity({ name: 'piece' })
export class Piece {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'plant_id' }) plantId!: string;
  @Column({ type: 'uuid', name: 'job_id' }) jobId!: string;
  @Column({ type: 'uuid', name: 'design_id' }) designId!: string;
  @Column({ type: 'text' }) mark!: string;
  @Column({ type: 'text', nullable: true }) bed!: string | null;
  @Column({ type: 'date', name: 'cast_date' }) castDate!: string;
  @Column({ type: 'date', name: 'release_date' }) releaseDate!: string;
  @Column({ type: 'date', name: 'ship_date', nullable: true }) shipDate!: string | null;
  @Column({ type: 'date', name: 'erection_date', nullable: true }) erectionDate!: string | null;
  @Column({ type: 'text', nullable: true }) bay!: string | null;
  @Column({ type: 'integer', name: 'bay_position', nullable: true }) bayPosition!: number | null;
  @Column({ type: 'text' }) status!: PieceStatus;
  @VersionColumn({ type: 'integer' }) version!: number;
  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' }) createdAt!: Date;
  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' }) updatedAt!: Date;
}
