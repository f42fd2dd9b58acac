/**
 * Survey format upgrades (shared/schemas/upgrade.ts): a version 1 document, as the app wrote them
 * before version 2, reads as a valid current document everywhere a document may be old: a file, a
 * push from a device on older code, the device store. Common practice, no source.
 */
import { describe, expect, it } from 'vitest';
import { SURVEY_SCHEMA_VERSION, SurveySchema, UpgradingSurveySchema, type Survey } from '@shared/schemas/survey';
import { needsUpgrade, upgradeSurvey } from '@shared/schemas/upgrade';
import { PushRequestSchema } from '@shared/schemas/sync';
import { parseSurveyFile } from '../../client/src/features/workspace/utils/survey-file';
import { upgradeStoredSurveys, type LocalSurvey, type OutboxEntry } from '../../client/src/offline/db';
import { demoSurvey } from '../../seeds/demo-survey';

/** A version 1 document: the demo survey as version 1 wrote it (v2 only added optional fields). */
function v1Doc(): Record<string, unknown> {
  const doc: Record<string, unknown> = JSON.parse(JSON.stringify(demoSurvey()));
  doc.schemaVersion = 1;
  return doc;
}

const deepFreeze = <T,>(v: T): T => {
  if (v && typeof v === 'object') {
    Object.values(v).forEach(deepFreeze);
    Object.freeze(v);
  }
  return v;
};

describe('upgradeSurvey', () => {
  it('brings a version 1 document to the current version, without touching its input', () => {
    expect(SURVEY_SCHEMA_VERSION).toBe(2);
    const old = deepFreeze(v1Doc());
    expect(SurveySchema.safeParse(old).success).toBe(false);
    const up = upgradeSurvey(old) as Survey;
    expect(up).not.toBe(old);
    expect(old.schemaVersion).toBe(1);
    expect(up.schemaVersion).toBe(2);
    const parsed = SurveySchema.parse(up);
    // Nothing but the version changes from 1 to 2.
    expect({ ...parsed, schemaVersion: 1 }).toEqual(old);
  });

  it('returns a current document, a newer one and anything that is not a survey as the very same value', () => {
    const current = demoSurvey();
    expect(upgradeSurvey(current)).toBe(current);
    expect(needsUpgrade(current)).toBe(false);
    const newer = { ...v1Doc(), schemaVersion: 3 };
    expect(upgradeSurvey(newer)).toBe(newer);
    for (const odd of [null, 7, 'x', [], { schemaVersion: '1' }, { schemaVersion: 1.5 }, { schemaVersion: 0 }]) {
      expect(upgradeSurvey(odd)).toBe(odd);
    }
  });

  it('a document from a newer app is refused with a message saying so', () => {
    const r = UpgradingSurveySchema.safeParse({ ...v1Doc(), schemaVersion: 3 });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].message).toMatch(/newer version needs an updated app/);
  });
});

describe('where an old document is read', () => {
  it('an imported version 1 file', () => {
    const r = parseSurveyFile(JSON.stringify(v1Doc()));
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.survey.schemaVersion).toBe(2);
  });

  it('a push that creates a survey from a device still on version 1', () => {
    const doc = v1Doc();
    const body = PushRequestSchema.parse({
      changes: [
        {
          id: crypto.randomUUID(),
          deviceId: crypto.randomUUID(),
          seq: 1,
          surveyId: doc.id,
          baseRevision: 0,
          createdAt: new Date().toISOString(),
          op: { kind: 'create', survey: doc },
        },
      ],
    });
    const op = body.changes[0].op;
    expect(op.kind === 'create' && op.survey.schemaVersion).toBe(2);
  });

  it('the device store: working copy, server copy and a queued creation', async () => {
    const surveys: Partial<LocalSurvey>[] = [
      { id: 'a', doc: v1Doc() as unknown as Survey, serverDoc: v1Doc() as unknown as Survey },
      { id: 'b', doc: v1Doc() as unknown as Survey, serverDoc: null },
    ];
    const outbox: Partial<OutboxEntry>[] = [
      { op: { kind: 'create', survey: v1Doc() as unknown as Survey } },
      { op: { kind: 'delete', collection: 'fluids', entityId: 'x' } },
    ];
    const rows: Record<string, object[]> = { surveys, outbox };
    // Just enough of a Dexie upgrade transaction: table(name).toCollection().modify(fn).
    const tx = {
      table: (name: string) => ({
        toCollection: () => ({
          modify: async (fn: (row: never) => void) => rows[name].forEach((r) => fn(r as never)),
        }),
      }),
    };
    await upgradeStoredSurveys(tx as never);
    expect(surveys.map((s) => [s.doc?.schemaVersion, s.serverDoc?.schemaVersion ?? null])).toEqual([
      [2, 2],
      [2, null],
    ]);
    const created = outbox[0].op;
    expect(created?.kind === 'create' && created.survey.schemaVersion).toBe(2);
    expect(SurveySchema.safeParse(surveys[0].doc).success).toBe(true);
  });
});
