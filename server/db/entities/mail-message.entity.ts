import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A message captured by the local SMTP server (development and tests) or sent through a relay. */
@Entity({ name: 'mail_messages' })
export class MailMessage {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @CreateDateColumn({ type: 'timestamptz' })
  at!: Date;

  @Column({ name: 'mail_from', type: 'varchar', length: 320 })
  from!: string;

  @Column({ name: 'mail_to', type: 'text', array: true })
  to!: string[];

  @Column({ type: 'varchar', length: 500 })
  subject!: string;

  @Column({ type: 'text' })
  text!: string;

  @Column({ type: 'text', nullable: true })
  html!: string | null;

  /** 'captured' (local capture server) or 'relayed' (sent through SMTP_URL). */
  @Column({ type: 'varchar', length: 16 })
  transport!: string;
}
