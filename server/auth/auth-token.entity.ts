import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A single-use token sent by e-mail: password reset or invitation. Only its hash is stored. */
@Entity({ name: 'auth_token' })
export class AuthToken {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'uuid', name: 'user_id' }) userId!: string;
  @Column({ type: 'text' }) kind!: 'reset' | 'invite';
  @Column({ type: 'text', name: 'token_hash' }) tokenHash!: string;
  @Column({ type: 'timestamptz', name: 'expires_at' }) expiresAt!: Date;
  @Column({ type: 'timestamptz', name: 'used_at', nullable: true }) usedAt!: Date | null;
  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' }) createdAt!: Date;
}
