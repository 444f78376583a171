import { Column, Entity, JoinColumn, OneToOne, PrimaryColumn, type Relation } from 'typeorm';
import { Attachment } from './attachment.entity.js';

// The bytes of an attachment, in their own table so listing attachments never reads them.
@Entity({ name: 'attachment_content' })
export class AttachmentContent {
  @PrimaryColumn({ type: 'int', unsigned: true })
  attachmentId!: number;

  @OneToOne(() => Attachment, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'attachmentId' })
  attachment!: Relation<Attachment>;

  @Column({ type: 'longblob' })
  data!: Buffer;
}
