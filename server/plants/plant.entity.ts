import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

@Entity({ name: 'plant' })
export class Plant {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'text' }) name!: string;
  @Column({ type: 'text', unique: true }) code!: string;
  @Column({ type: 'text', name: 'time_zone' }) timeZone!: string;
  @Column({ type: 'text', name: 'unit_system' }) unitSystem!: 'us' | 'si';
  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' }) createdAt!: Date;
}
