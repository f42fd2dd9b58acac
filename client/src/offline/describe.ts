/** Plain words for an edit or a conflict target, for lists the user reads. */
import type { ConflictTarget, SurveyOp } from '@shared/schemas/sync';
import { ENTITY_NOUNS as NOUN } from '@shared/api/entity-nouns';

const FIELD: Record<string, string> = {
  title: 'title',
  casualtyDescription: 'casualty description',
  vessel: 'vessel particulars',
  vesselId: 'vessel',
  activeConditionId: 'active condition',
};

const nameOf = (entity: unknown): string => {
  const e = entity as { name?: unknown; caption?: unknown } | null;
  return typeof e?.name === 'string' ? ` “${e.name}”` : typeof e?.caption === 'string' && e.caption ? ` “${e.caption}”` : '';
};

export function describeOp(op: SurveyOp): string {
  switch (op.kind) {
    case 'create':
      return `Create survey “${op.survey.title}”`;
    case 'set':
      return `Change the ${FIELD[op.path] ?? op.path}`;
    case 'upsert':
      return `Save ${NOUN[op.collection]}${nameOf(op.entity)}`;
    case 'patch':
      return `Change the ${op.path[0]} of a ${NOUN[op.collection]}`;
    case 'delete':
      return `Delete a ${NOUN[op.collection]}`;
    case 'resolve-conflict':
      return `Settle a conflict (${describeTarget(op.target)})`;
    case 'submit':
      return 'Send the survey for review';
  }
}

export function describeTarget(t: ConflictTarget, entity?: unknown): string {
  if (t.kind === 'field') return FIELD[t.path] ?? t.path;
  if (t.kind === 'entity') return `${NOUN[t.collection]}${nameOf(entity)}`;
  return `${t.field} of ${NOUN[t.collection]}${nameOf(entity)}`;
}
