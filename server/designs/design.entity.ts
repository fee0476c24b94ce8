import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { DesignSpec } from '#shared/api/designs';

/** A member design, versioned: a design used by pieces is never changed in place. */
@Entity({ name: 'member_design' })
export class MemberDesign {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'plant_id' }) plantId!: string;
  @Column({ type: 'text' }) code!: string;
  @Column({ type: 'text' }) name!: string;
  @Column({ type: 'text', name: 'product_type' }) productType!: string;
  @Column({ type: 'integer' }) version!: number;
  @Column({ type: 'jsonb' }) spec!: DesignSpec;
  @Column({ type: 'uuid', name: 'created_by', nullable: true }) createdBy!: string | null;
  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' }) createdAt!: Date;
}
