/**
 * A device in Node for sync tests and the benchmark: it keeps its own copy of each survey, an
 * outbox of changes with a per-device sequence, and merges pulls the way the app's store does
 * (server copy + pending edits replayed with the shared `applyOp`). Its network calls fail like a
 * real phone's: a lost response leaves the outbox untouched, and the next push sends it again.
 */
import { randomUUID } from 'node:crypto';
import { SurveySchema, type Survey } from '@shared/schemas/survey';
import {
  PullResponseSchema,
  PushResponseSchema,
  type Conflict,
  type PushResponse,
  type SurveyChange,
  type SurveyOp,
} from '@shared/schemas/sync';
import { applyOp, changedFields, findEntity, replay } from '@shared/sync/apply';

interface Copy {
  serverDoc: Survey | null;
  serverRevision: number;
  doc: Survey;
}

export class SimDevice {
  readonly deviceId = randomUUID();
  private seq = 0;
  outbox: SurveyChange[] = [];
  rejected: { change: SurveyChange; reason: string }[] = [];
  readonly copies = new Map<string, Copy>();
  readonly conflicts = new Map<string, Conflict>();
  /** Every change this device ever made, by id. */
  readonly made = new Map<string, SurveyChange>();
  cursor = '0';

  constructor(
    public baseUrl: string,
    public token: string,
  ) {}

  private headers() {
    return { authorization: `Bearer ${this.token}`, 'content-type': 'application/json' };
  }

  private queue(surveyId: string, op: SurveyOp, baseRevision: number): SurveyChange {
    const change: SurveyChange = {
      id: randomUUID(),
      deviceId: this.deviceId,
      seq: ++this.seq,
      surveyId,
      baseRevision,
      createdAt: new Date().toISOString(),
      op,
    };
    this.outbox.push(change);
    this.made.set(change.id, change);
    return change;
  }

  doc(surveyId: string): Survey | undefined {
    return this.copies.get(surveyId)?.doc;
  }

  create(survey: Survey): SurveyChange {
    this.copies.set(survey.id, { serverDoc: null, serverRevision: 0, doc: survey });
    return this.queue(survey.id, { kind: 'create', survey }, 0);
  }

  /** Edits the local copy and queues the change, as applyLocalChange does on the phone. */
  edit(surveyId: string, raw: SurveyOp): SurveyChange | null {
    const copy = this.copies.get(surveyId);
    if (!copy) throw new Error('no such survey on this device');
    let op = raw;
    if (op.kind === 'upsert') {
      const before = findEntity(copy.doc, op.collection, op.entity.id);
      const fields = before ? changedFields(before, op.entity) : undefined;
      if (fields && fields.length === 0) return null;
      op = { ...op, fields };
    }
    const next = applyOp(copy.doc, op);
    const check = SurveySchema.safeParse(next);
    if (!check.success) throw new Error(`invalid edit: ${check.error.issues[0]?.message}`);
    copy.doc = next;
    return this.queue(surveyId, op, copy.serverRevision);
  }

  /** Pushes up to `batch` pending changes; throws when the response is lost. */
  async push(batch = 100): Promise<PushResponse | null> {
    const sending = this.outbox.slice(0, batch);
    if (sending.length === 0) return null;
    const res = await fetch(`${this.baseUrl}/api/sync/push`, {
      method: 'POST',
      headers: this.headers(),
      body: JSON.stringify({ changes: sending }),
    });
    if (!res.ok) throw new Error(`push answered ${res.status}: ${await res.text()}`);
    const body = PushResponseSchema.parse(await res.json());
    const done = new Set<string>();
    const refused = new Set<string>();
    for (const r of body.results) {
      done.add(r.changeId);
      if (r.status === 'rejected') {
        const c = sending.find((s) => s.id === r.changeId)!;
        this.rejected.push({ change: c, reason: r.reason ?? '' });
        refused.add(c.surveyId);
      }
    }
    this.outbox = this.outbox.filter((c) => !done.has(c.id));
    for (const c of body.conflicts) this.conflicts.set(c.id, c);
    for (const id of refused) this.rebase(id);
    return body;
  }

  private rebase(surveyId: string) {
    const copy = this.copies.get(surveyId);
    if (!copy) return;
    const doc = replay(copy.serverDoc, this.outbox.filter((c) => c.surveyId === surveyId).map((c) => c.op));
    if (doc) copy.doc = doc;
  }

  async pull(): Promise<void> {
    for (;;) {
      const res = await fetch(`${this.baseUrl}/api/sync/pull?cursor=${encodeURIComponent(this.cursor)}`, { headers: this.headers() });
      if (!res.ok) throw new Error(`pull answered ${res.status}: ${await res.text()}`);
      const body = PullResponseSchema.parse(await res.json());
      for (const s of body.surveys) {
        const copy = this.copies.get(s.id);
        if (copy && copy.serverRevision > s.revision) continue;
        const pending = this.outbox.filter((c) => c.surveyId === s.id).map((c) => c.op);
        this.copies.set(s.id, { serverDoc: s.doc, serverRevision: s.revision, doc: replay(s.doc, pending) ?? s.doc });
      }
      for (const c of body.conflicts) this.conflicts.set(c.id, c);
      this.cursor = body.cursor;
      if (!body.hasMore) return;
    }
  }

  /** Pushes everything and pulls; throws on a lost response (call again). */
  async sync(batch = 100): Promise<void> {
    while (this.outbox.length > 0) await this.push(batch);
    await this.pull();
  }

  /** Syncs until it goes through, up to `tries` times. */
  async syncUntilDone(tries = 50, batch = 100): Promise<void> {
    let lastError: unknown;
    for (let i = 0; i < tries; i++) {
      try {
        await this.sync(batch);
        return;
      } catch (err) {
        lastError = err;
        await new Promise((r) => setTimeout(r, 20));
      }
    }
    throw lastError;
  }
}
