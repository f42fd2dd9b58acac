/**
 * The workspace computes a big survey in a Web Worker (Comlink): its answer must be the engine's
 * answer run in place, every number bit for bit, after crossing the message channel by structured
 * clone as it does in the browser. Node's MessageChannel uses the same structured clone algorithm
 * (HTML Living Standard, §2.7 "Safe passing of structured data") as a browser's worker.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { expose, wrap } from 'comlink';
import { computeSurveySummary, forecastFlooding, type SurveySummary } from '@shared/engine';
import { SurveySchema, type Survey } from '@shared/schemas/survey';
import { engineApi, type EngineApi } from '@client/features/workspace/worker/engine-api';
import { demoSurvey } from '../../../seeds/demo-survey';
import { bigSurvey } from '../../support/big-survey';

const channel = new MessageChannel();
expose(engineApi, channel.port1);
const remote = wrap<EngineApi>(channel.port2);
afterAll(() => {
  channel.port1.close();
  channel.port2.close();
});

/** Every own field equal; typed-array columns compared byte for byte (so NaN payloads and −0 count too). */
function expectIdentical(a: SurveySummary, b: SurveySummary) {
  expect(b).toStrictEqual(a);
  for (const [key, column] of Object.entries(a.boundaries)) {
    if (!ArrayBuffer.isView(column)) continue;
    const other = (b.boundaries as unknown as Record<string, ArrayBufferView>)[key];
    expect(Object.getPrototypeOf(other), key).toBe(Object.getPrototypeOf(column));
    expect(Buffer.from(other.buffer, other.byteOffset, other.byteLength).equals(Buffer.from(column.buffer, column.byteOffset, column.byteLength)), key).toBe(true);
  }
}

describe('the engine worker', () => {
  it('answers the demo survey exactly as the engine in place', async () => {
    const s: Survey = SurveySchema.parse(demoSurvey());
    expectIdentical(computeSurveySummary(s), await remote.summary(s));
  });
  it('answers the 2,000-boundary survey exactly as the engine in place', { timeout: 60_000 }, async () => {
    const s = bigSurvey();
    const there = await remote.summary(s);
    expect(there.boundaries.length).toBe(2000);
    expectIdentical(computeSurveySummary(s), there);
  });
  it('answers the demo flooding forecast exactly as the engine in place (the Flooding section shows the worker\'s)', { timeout: 60_000 }, async () => {
    const s: Survey = SurveySchema.parse(demoSurvey());
    const here = forecastFlooding(s);
    const there = await remote.forecast(s);
    expect(here.limits.length).toBeGreaterThan(0);
    expect(there).toStrictEqual(here);
  });
});
