import { describe, expect, it } from 'vitest';
import {
  exifLines,
  formatBytes,
  formatDate,
  formatDateTime,
  formatExposure,
  formatLocalDateTime,
  formatNumber,
} from '../../shared/format.ts';
import { describeHistory } from '../../shared/history-words.ts';

describe('one format for dates and numbers', () => {
  it("writes dates as ISO 8601 in the reader's time zone", () => {
    const d = new Date(2025, 2, 14, 10, 22, 5);
    expect(formatDate(d)).toBe('2025-03-14');
    expect(formatDateTime(d)).toBe('2025-03-14 10:22');
    expect(formatDateTime(d.toISOString())).toBe('2025-03-14 10:22');
    // A camera's clock has no zone: shown as written, never shifted.
    expect(formatLocalDateTime('2025-03-14T10:22:05')).toBe('2025-03-14 10:22');
    expect(formatDate('not a date')).toBe('not a date');
  });

  it('never writes −0.0, and writes a true minus sign', () => {
    expect(formatNumber(-0.04)).toBe('0.0');
    expect(formatNumber(-0)).toBe('0.0');
    expect(formatNumber(-0.004, 2)).toBe('0.00');
    expect(formatNumber(-1.26)).toBe('−1.3');
    expect(formatNumber(12.35, 1)).toBe('12.3'); // toFixed's own binary rounding, as everywhere else
    expect(formatNumber(7, 0)).toBe('7');
  });

  it('writes file sizes as people say them', () => {
    expect(formatBytes(512)).toBe('512 bytes');
    expect(formatBytes(23_456)).toBe('23 kB');
    expect(formatBytes(4_234_567)).toBe('4.2 MB');
  });

  it('gives EXIF as labelled values with units', () => {
    expect(formatExposure(1 / 60)).toBe('1/60 s');
    expect(formatExposure(0.00025)).toBe('1/4000 s');
    expect(formatExposure(2)).toBe('2 s');
    expect(
      exifLines({
        make: 'Canon',
        model: 'Canon EOS 5D',
        exposureTime: 1 / 60,
        fNumber: 8,
        iso: 200,
        focalLengthMm: 50,
        dateTimeOriginal: '2025:03:14 10:22:05',
      }),
    ).toEqual([
      { label: 'Camera', value: 'Canon EOS 5D' },
      { label: 'Exposure', value: '1/60 s' },
      { label: 'Aperture', value: 'f/8' },
      { label: 'Sensitivity', value: 'ISO 200' },
      { label: 'Focal length', value: '50 mm' },
      { label: 'Taken', value: "2025-03-14 10:22 (camera's clock)" },
    ]);
    expect(exifLines({ make: 'Phase', model: 'IQ4', fNumber: 5.6 })).toEqual([
      { label: 'Camera', value: 'Phase IQ4' },
      { label: 'Aperture', value: 'f/5.6' },
    ]);
  });
});

describe('history in words', () => {
  it('names what changed, never the field names', () => {
    expect(
      describeHistory({ action: 'reference-patch-set', changes: { referencePatch: { from: null, to: { x: 1 } } } }),
    ).toBe('reference patch set');
    expect(describeHistory({ action: 'chart-set', changes: { chart: { from: null, to: { corners: [] } } } })).toBe(
      'colour chart marked',
    );
    expect(describeHistory({ action: 'chart-set', changes: { chart: { from: { corners: [] }, to: {} } } })).toBe(
      'colour chart marked again',
    );
    expect(describeHistory({ action: 'fading-pair-added', changes: {} })).toBe('fading pair added');
    expect(
      describeHistory({ action: 'photo-ingest-retried', changes: { ingestError: { from: 'damaged', to: null } } }),
    ).toBe('started processing a photo again after it failed');
    expect(
      describeHistory({
        action: 'region-added',
        changes: { region: { from: null, to: { label: 'ground red', purpose: 'colour-area' } } },
      }),
    ).toBe('colour area ‘ground red’ added');
    expect(
      describeHistory({
        action: 'region-removed',
        changes: { region: { from: { label: null, purpose: 'exclusion' }, to: null } },
      }),
    ).toBe('exclusion removed');
    expect(
      describeHistory({
        action: 'update',
        changes: {
          dateEdtf: { from: null, to: '1770' },
          historicalMordants: { from: [], to: [] },
          heightMm: { from: 1, to: 2 },
        },
      }),
    ).toBe('changed the date (EDTF), historical mordants and height (mm)');
    expect(
      describeHistory({ action: 'palette-background', changes: { 'colour #f0ede6': { from: false, to: true } } }),
    ).toBe('colour #f0ede6 marked as background');
    expect(describeHistory({ action: 'photo-updated', changes: { caption: { from: null, to: 'x' } } })).toBe(
      'changed a photo’s caption',
    );
  });
});
