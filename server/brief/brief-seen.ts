/**
 * What the master saw on the brief, as a short token carried by the acknowledgement form: the shown
 * revision plus a hash of what can change on the page without a new revision (verdicts, limits,
 * status, who accepted, the engine that computed the figures). The acknowledgement is logged only
 * when the token still matches the brief as it is now, so "received and understood" always means
 * the brief the master actually read.
 */
import { createHash } from 'node:crypto';
import { ENGINE_VERSION } from '@shared/engine';
import type { BriefPageData } from './brief-data';

/** Lists whose row order the database does not fix (equal timestamps): compare as sorted sets. */
const sortedJson = (rows: readonly unknown[]): string[] => rows.map((r) => JSON.stringify(r)).sort();

export function briefSeenToken(d: BriefPageData): string {
  const shownRevision = d.shownRevision ?? d.revision;
  const seen = JSON.stringify({
    engine: ENGINE_VERSION,
    status: d.status,
    shownRevision,
    newerRevision: d.newerRevision ?? null,
    figuresWithheld: d.figuresWithheld ?? false,
    acceptedBy: d.reviewedBy,
    acceptedAt: d.reviewedAt,
    units: d.units,
    verdicts: sortedJson(d.verdicts),
    limits: sortedJson(d.limits),
  });
  return `${shownRevision}.${createHash('sha256').update(seen).digest('base64url').slice(0, 16)}`;
}
