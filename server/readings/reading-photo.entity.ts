import { Column, CreateDateColumn, Entity, PrimaryColumn } from 'typeorm';

@Entity({ name: 'reading_photo' })
export class ReadingPhoto {
  @PrimaryColumn({ type: 'uuid', name: 'reading_id' }) readingId!: string;
  @Column({ type: 'uuid', name: 'plant_id' }) plantId!: string;
  @Column({ type: 'text', name: 'content_type' }) contentType!: string;
  @Column({ type: 'integer' }) size!: number;
  @Column({ type: 'bytea' }) bytes!: Buffer;
  @Column({ type: 'uuid', name: 'uploaded_by' }) uploadedBy!: string;
  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' }) createdAt!: Date;
}
