// Frame numbers to x. The expected positions are worked by hand from the frame table (frames times their
// spacing, run by run): common practice of reading positions off painted frame numbers, no source.
import { describe, expect, it } from 'vitest';
import { DEFAULT_FRAME_TABLE, frameToX, parseFrameText, type FrameTable } from '@client/features/workspace/utils/frames';

describe('frameToX', () => {
  it('one run of 0.8 m frames: Fr 45 is 36 m forward of the aft perpendicular (45 × 0.8, by hand)', () => {
    expect(frameToX(45, DEFAULT_FRAME_TABLE)).toBeCloseTo(36, 12);
  });

  it('two runs: 20 frames of 0.6 m then 0.8 m frames put Fr 30 at 20 × 0.6 + 10 × 0.8 = 20 m (by hand)', () => {
    const table: FrameTable = { zeroFrame: 0, runs: [{ fromFrame: 20, spacingM: 0.8 }, { fromFrame: 0, spacingM: 0.6 }] };
    expect(frameToX(30, table)).toBeCloseTo(20, 12);
    expect(frameToX(20, table)).toBeCloseTo(12, 12);
    expect(frameToX(10, table)).toBeCloseTo(6, 12);
  });

  it('fractional frames interpolate within their run: Fr 22.5 is 12 + 2.5 × 0.8 = 14 m (by hand)', () => {
    const table: FrameTable = { zeroFrame: 0, runs: [{ fromFrame: 0, spacingM: 0.6 }, { fromFrame: 20, spacingM: 0.8 }] };
    expect(frameToX(22.5, table)).toBeCloseTo(14, 12);
  });

  it('a zero frame forward of frame 0 shifts every position: with Fr 5 at the AP, Fr 45 is 40 × 0.8 = 32 m (by hand)', () => {
    expect(frameToX(45, { zeroFrame: 5, runs: [{ fromFrame: 0, spacingM: 0.8 }] })).toBeCloseTo(32, 12);
  });

  it('frames aft of the first run extend it at its spacing (negative frames aft of the AP)', () => {
    expect(frameToX(-3, DEFAULT_FRAME_TABLE)).toBeCloseTo(-2.4, 12);
  });

  it('an empty table gives no position', () => {
    expect(frameToX(10, { zeroFrame: 0, runs: [] })).toBeNaN();
  });
});

describe('parseFrameText', () => {
  it.each([
    ['Fr 45', 45],
    ['fr45', 45],
    ['FR. 12', 12],
    ['F 45.5', 45.5],
    ['f 45,5', 45.5],
    ['#45', 45],
    ['  Fr -2  ', -2],
  ])('reads %j as frame %d', (text, frame) => {
    expect(parseFrameText(text)).toBe(frame);
  });

  it.each(['45', '12.5 m', 'Frame', 'Fr', 'Fr 4 5', ''])('leaves %j to be read as a number, not a frame', (text) => {
    expect(parseFrameText(text)).toBeNull();
  });
});
