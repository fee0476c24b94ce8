import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { Role } from '#shared/api/roles';

@Entity({ name: 'app_user' })
export class User {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'plant_id' }) plantId!: string;
  @Column({ type: 'text' }) email!: string;
  @Column({ type: 'text' }) name!: string;
  @Column({ type: 'text' }) role!: Role;
  /** Null until an invited user sets a password. */
  @Column({ type: 'text', name: 'password_hash', nullable: true }) passwordHash!: string | null;
  @Column({ type: 'boolean' }) active!: boolean;
  /** Viewers see one job only. */
  @Column({ type: 'uuid', name: 'job_id', nullable: true }) jobId!: string | null;
  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' }) createdAt!: Date;
  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' }) updatedAt!: Date;
}
