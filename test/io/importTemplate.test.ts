import { describe, expect, it } from 'vitest';
import { ForecatchError, ParseError } from '../../shared/errors';
import { createDelimitedReader } from '../../shared/io/delimited/createDelimitedReader';
import { parseImportTemplate, serializeImportTemplate, validateImportTemplate, type ImportTemplate } from '../../shared/io/importTemplate';

const LAB_TEMPLATE: ImportTemplate = {
  version: 1,
  name: 'rail lab export (invented layout)',
  markerUnits: 'mm',
  time: { column: 'Zeitstempel', units: 'ms' },
  markers: [{ label: 'ball', x: 'BX', y: 'BY', z: 4 }],
  channels: [{ label: 'biceps', column: 'A1', units: 'mV' }],
};

function readWith(text: string, template: ImportTemplate) {
  const r = createDelimitedReader('lab.csv', { template });
  r.push(text);
  return r.finish();
}

describe('import templates', () => {
  it('map named and numbered columns, convert mm to m and ms to s, and ignore unmapped columns', () => {
    const rec = readWith('Zeitstempel,BX,BY,BZ,A1,unused\n0,1000,2000,1500,0.5,9\n4,1001,2000,1490,0.6,9\n8,1002,2000,1470,0.7,9\n', LAB_TEMPLATE);
    expect(rec.markers!.rateHz).toBe(250);
    expect(rec.markers!.sourceUnits).toBe('mm');
    expect(Array.from(rec.markers!.markers[0].x)).toEqual([1, 1.001, 1.002]);
    expect(Array.from(rec.markers!.markers[0].z)).toEqual([1.5, 1.49, 1.47]);
    expect(rec.signals).toHaveLength(1);
    expect(rec.signals[0]).toMatchObject({ label: 'biceps', units: 'mV' });
  });

  it('give a fixed rate to files without a time column, and read files with no header by column number', () => {
    const t: ImportTemplate = { version: 1, headerLine: 0, time: { rateHz: 1000, startS: 0.5 }, channels: [{ label: 'emg', column: 2, units: 'V' }] };
    const rec = readWith('7,0.25\n7,0.5\n7,0.75\n', t);
    expect(rec.signals[0]).toMatchObject({ label: 'emg', units: 'V', rateHz: 1000, startS: 0.5 });
    expect(Array.from(rec.signals[0].values)).toEqual([0.25, 0.5, 0.75]);
  });

  it('fix the header line, delimiter and decimal mark when given', () => {
    const t: ImportTemplate = { version: 1, headerLine: 2, delimiter: ';', decimalComma: true, time: { column: 't', units: 's' }, channels: [{ label: 'x', column: 'v', units: '' }] };
    const rec = readWith('junk;junk;junk\nt;v;w\n0;1,5;2\n0,5;2,5;2\n', t);
    expect(Array.from(rec.signals[0].values)).toEqual([1.5, 2.5]);
    expect(rec.signals[0].rateHz).toBe(2);
  });

  it('name the header line and the column when a mapped column is absent', () => {
    try {
      readWith('Zeitstempel,BX,BY,BZ,A2\n0,1,2,3,4\n4,1,2,3,4\n', LAB_TEMPLATE);
      throw new Error('no error');
    } catch (e) {
      expect(e).toBeInstanceOf(ParseError);
      expect((e as ParseError).line).toBe(1);
      expect((e as Error).message).toContain('a column named "A1"');
    }
  });

  it('survive serialize -> parse unchanged', () => {
    const text = serializeImportTemplate(LAB_TEMPLATE);
    expect(parseImportTemplate(text, 'lab.json')).toEqual(LAB_TEMPLATE);
    expect(JSON.parse(text).version).toBe(1);
  });

  it('reject malformed templates, naming the field', () => {
    const bad: [unknown, string][] = [
      [null, '(root)'],
      [{ version: 2, time: { rateHz: 1 }, channels: [{ label: 'a', column: 1 }] }, 'version'],
      [{ version: 1, time: { column: 't', units: 'min' }, channels: [{ label: 'a', column: 1 }] }, 'time.units'],
      [{ version: 1, time: { rateHz: -5 }, channels: [{ label: 'a', column: 1 }] }, 'time.rateHz'],
      [{ version: 1, time: { rateHz: NaN }, channels: [{ label: 'a', column: 1 }] }, 'time.rateHz'],
      [{ version: 1, time: { rateHz: 1 }, channels: [{ label: 'a', column: 0 }] }, 'channels[0].column'],
      [{ version: 1, time: { rateHz: 1 }, markers: [{ label: 'm', x: 'a', y: 'b' }] }, 'markers[0].z'],
      [{ version: 1, time: { rateHz: 1 }, markerUnits: 'cm', markers: [{ label: 'm', x: 1, y: 2, z: 3 }] }, 'markerUnits'],
      [{ version: 1, time: { rateHz: 1 } }, 'markers/channels'],
      [{ version: 1, delimiter: '|', time: { rateHz: 1 }, channels: [{ label: 'a', column: 1 }] }, 'delimiter'],
    ];
    for (const [value, field] of bad) {
      expect(() => validateImportTemplate(value)).toThrow(ForecatchError);
      expect(() => validateImportTemplate(value)).toThrow(field);
    }
    expect(() => parseImportTemplate('{not json', 'x.json')).toThrow(/x\.json: expected JSON/);
  });
});
