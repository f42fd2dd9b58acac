/** The items of a survey a comment can attach to, with plain names. */
import type { CommentTarget } from '@shared/api/review';
import type { Survey } from '@shared/schemas/survey';
import { conditionName } from '@shared/review/plain-words';

export interface TargetOption {
  key: string;
  target: CommentTarget;
  label: string;
}

export const targetKey = (t: CommentTarget) => `${t.kind}:${t.id}`;

export function targetOptions(doc: Survey): TargetOption[] {
  const opt = (target: CommentTarget, label: string): TargetOption => ({ key: targetKey(target), target, label });
  return [
    opt({ kind: 'survey', id: doc.id }, `Whole survey`),
    opt({ kind: 'vessel', id: doc.id }, `Vessel: ${doc.vessel.name}`),
    ...doc.conditions.map((c) => opt({ kind: 'condition', id: c.id }, `Readings: ${conditionName(c, doc.vessel.shipTimeOffsetMin)}`)),
    ...doc.compartments.map((c) => opt({ kind: 'compartment', id: c.id }, `Space: ${c.name}`)),
    ...doc.boundaries.map((b) => opt({ kind: 'boundary', id: b.id }, `Boundary: ${b.name}`)),
    ...(doc.photos ?? []).map((p) => opt({ kind: 'photo', id: p.id }, `Photo: ${p.caption || 'no caption'}`)),
  ];
}

export function targetLabel(doc: Survey, t: CommentTarget): string {
  return targetOptions(doc).find((o) => o.key === targetKey(t))?.label ?? `${t.kind} (no longer in the survey)`;
}
