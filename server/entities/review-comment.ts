import { EntitySchema } from 'typeorm'

/** A reviewer's comment on a revision under review, pinned to the set, a sheet or a circuit. */
export interface ReviewComment {
  id: string
  organizationId: string
  projectId: string
  revisionId: string
  anchorKind: 'general' | 'sheet' | 'circuit'
  /** The sheet id or the circuit id; null for a general comment. */
  anchorRef: string | null
  body: string
  authorId: string | null
  createdAt: Date
  resolvedAt: Date | null
  resolvedBy: string | null
}

export const ReviewCommentEntity = new EntitySchema<ReviewComment>({
  name: 'ReviewComment',
  tableName: 'review_comments',
  columns: {
    id: { type: 'uuid', primary: true, generated: 'uuid' },
    organizationId: { name: 'organization_id', type: 'uuid' },
    projectId: { name: 'project_id', type: 'uuid' },
    revisionId: { name: 'revision_id', type: 'uuid' },
    anchorKind: { name: 'anchor_kind', type: 'text' },
    anchorRef: { name: 'anchor_ref', type: 'text', nullable: true },
    body: { type: 'text' },
    authorId: { name: 'author_id', type: 'uuid', nullable: true },
    createdAt: { name: 'created_at', type: 'timestamptz', createDate: true },
    resolvedAt: { name: 'resolved_at', type: 'timestamptz', nullable: true },
    resolvedBy: { name: 'resolved_by', type: 'uuid', nullable: true },
  },
})

/** An answer in a comment's thread (the designer's reply, the reviewer's follow-up). */
export interface ReviewReply {
  id: string
  organizationId: string
  commentId: string
  body: string
  authorId: string | null
  createdAt: Date
}

export const ReviewReplyEntity = new EntitySchema<ReviewReply>({
  name: 'ReviewReply',
  tableName: 'review_replies',
  columns: {
    id: { type: 'uuid', primary: true, generated: 'uuid' },
    organizationId: { name: 'organization_id', type: 'uuid' },
    commentId: { name: 'comment_id', type: 'uuid' },
    body: { type: 'text' },
    authorId: { name: 'author_id', type: 'uuid', nullable: true },
    createdAt: { name: 'created_at', type: 'timestamptz', createDate: true },
  },
})
