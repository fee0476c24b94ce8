import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** Who changed what, with the state before and after. Append-only. */
@Entity({ name: 'audit_event' })
export class AuditEvent {
  @PrimaryGeneratedColumn('increment', { type: 'bigint' }) id!: string;
  @Column({ type: 'uuid', name: 'plant_id', nullable: true }) plantId!: string | null;
  @Column({ type: 'uuid', name: 'user_id', nullable: true }) userId!: string | null;
  @Column({ type: 'text' }) action!: string;
  @Column({ type: 'text' }) entity!: string;
  @Column({ type: 'text', name: 'entity_id', nullable: true }) entityId!: string | null;
  @Column({ type: 'jsonb', nullable: true }) before!: unknown;
  @Column({ type: 'jsonb', nullable: true }) after!: unknown;
  @Column({ type: 'timestamptz' }) at!: Date;
}
