import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

@Entity('organisations')
export class Organisation {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'text' })
  name: string;

  @Column({ type: 'text', unique: true })
  slug: string;

  /** IANA zone: "today" and every date shown are in this zone. */
  @Column({ type: 'text' })
  timeZone: string;

  @CreateDateColumn({ type: 'timestamptz' })
  createdAt: Date;

  /** Days a recording is kept before the retention job deletes it (admin-set; issue 6 §6). */
  @Column({ type: 'integer', default: 180 })
  recordingRetentionDays: number;
}
