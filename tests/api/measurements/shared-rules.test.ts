/**
 * The rules in shared/schemas that the server applies and the client
 * previews: readings tables, file names, natural order, set-up needs.
 * Pure functions; no services needed.
 */
import { describe, expect, it } from 'vitest';
import { compareFrameFileNames, sanitiseFrameFileName } from '../../../shared/schemas/frames';
import { measurementSetupProblems } from '../../../shared/schemas/measurements';
import { assignReadings, parseReadingsTable, readingsFromStartStep } from '../../../shared/schemas/readings';

describe('parseReadingsTable', () => {
  it('reads comma, semicolon, tab and space separated lines, skipping a header, blank lines and # comments', () => {
    const text = ['file,position', '0001.png,447.0', '', '# moved the carrier', '0002.png;447,5', '0003.png\t448', '0004.png   448.5 mm'].join('\n');
    const parsed = parseReadingsTable(text);
    expect(parsed.headerLine).toBe(1);
    expect(parsed.problems).toEqual([]);
    expect(parsed.rows).toEqual([
      { line: 2, fileName: '0001.png', positionMm: 447 },
      { line: 5, fileName: '0002.png', positionMm: 447.5 },
      { line: 6, fileName: '0003.png', positionMm: 448 },
      { line: 7, fileName: '0004.png', positionMm: 448.5 },
    ]);
  });

  it('reads Windows line endings, a byte-order mark, quoted CSV cells and a trailing separator', () => {
    const parsed = parseReadingsTable('\uFEFF"frame 1.png","447.25",\r\n"frame 2.png","-3e-1"\r\n');
    expect(parsed.problems).toEqual([]);
    expect(parsed.rows).toEqual([
      { line: 1, fileName: 'frame 1.png', positionMm: 447.25 },
      { line: 2, fileName: 'frame 2.png', positionMm: -0.3 },
    ]);
  });

  it('keeps spaces inside a file name when spaces separate the columns (the reading is the last word)', () => {
    expect(parseReadingsTable('best focus 01.tif 450.125').rows).toEqual([{ line: 1, fileName: 'best focus 01.tif', positionMm: 450.125 }]);
  });

  it('reports a non-numeric reading, a missing column and too many columns by line, and takes no header after the first line', () => {
    const parsed = parseReadingsTable(['0001.png,447.0', '0002.png,abc', '0003.png', '0004.png,1,2', '0005.png,'].join('\n'));
    expect(parsed.headerLine).toBeNull();
    expect(parsed.rows.map((r) => r.fileName)).toEqual(['0001.png']);
    expect(parsed.problems).toEqual([
      { line: 2, message: 'Line 2: the reading "abc" for 0002.png is not a number.' },
      { line: 3, message: 'Line 3 has one column; give two: the file name and the rail reading (mm).' },
      { line: 4, message: 'Line 4 has 3 columns; give two: the file name and the rail reading (mm).' },
      { line: 5, message: 'Line 5 gives no reading for 0005.png.' },
    ]);
  });

  it('does not mistake a first data line with a bad reading for a header', () => {
    const parsed = parseReadingsTable('0001.png,4x7\n0002.png,448');
    expect(parsed.headerLine).toBeNull();
    expect(parsed.problems).toEqual([{ line: 1, message: 'Line 1: the reading "4x7" for 0001.png is not a number.' }]);
  });

  it('refuses a decimal comma when the comma separates the columns', () => {
    expect(parseReadingsTable('0001.png,447,5').problems[0].message).toBe(
      'Line 1 has 3 columns; give two: the file name and the rail reading (mm).',
    );
  });
});

describe('assignReadings', () => {
  const fileNames = ['0001.png', '0002.png', '0003.png'];

  it('gives every frame its one reading, matching a table name by its last path segment', () => {
    const result = assignReadings({
      fileNames,
      rows: [
        { fileName: 's1/0001.png', positionMm: 1 },
        { fileName: '0002.png', positionMm: 2 },
        { fileName: '0003.png', positionMm: 3 },
      ],
    });
    expect(result.problems).toEqual({});
    expect(Object.fromEntries(result.positionsMmByFileName)).toEqual({ '0001.png': 1, '0002.png': 2, '0003.png': 3 });
  });

  it('names a duplicated file with its lines, an unknown file, and a frame left without a reading', () => {
    const result = assignReadings({
      fileNames,
      rows: [
        { fileName: '0001.png', positionMm: 1, line: 2 },
        { fileName: '0001.png', positionMm: 1.1, line: 5 },
        { fileName: '0002.png', positionMm: 2, line: 3 },
        { fileName: '0009.png', positionMm: 9, line: 4 },
      ],
    });
    expect(result.problems).toEqual({
      '0001.png': '0001.png has 2 readings (lines 2 and 5); give exactly one.',
      '0009.png': '0009.png (line 4) is not a frame of this sweep.',
      '0003.png': '0003.png has no reading.',
    });
  });
});

describe('readingsFromStartStep and compareFrameFileNames', () => {
  it('orders file names naturally: frame2 before frame10, and frame01 next to frame1', () => {
    const names = ['frame10.png', 'frame2.png', 'frame1.png', 'Frame3.png', 'frame01.png'];
    expect([...names].sort(compareFrameFileNames)).toEqual(['frame01.png', 'frame1.png', 'frame2.png', 'Frame3.png', 'frame10.png']);
  });

  it('numbers frames from the start in that order, without binary rounding noise (447 + 3 × 0.1 is 447.3)', () => {
    const rows = readingsFromStartStep({ fileNames: ['f10.png', 'f2.png', 'f1.png', 'f3.png'], startMm: 447, stepMm: 0.1 });
    expect(rows).toEqual([
      { fileName: 'f1.png', positionMm: 447 },
      { fileName: 'f2.png', positionMm: 447.1 },
      { fileName: 'f3.png', positionMm: 447.2 },
      { fileName: 'f10.png', positionMm: 447.3 },
    ]);
  });
});

describe('sanitiseFrameFileName', () => {
  it('keeps the last path segment and the extension, and strips control, format and path characters', () => {
    expect(sanitiseFrameFileName('../../etc/0001.png')).toEqual({ ok: true, fileName: '0001.png', format: 'png' });
    expect(sanitiseFrameFileName('C:\\bench\\run 3\\0002.TIF')).toEqual({ ok: true, fileName: '0002.TIF', format: 'tiff' });
    expect(sanitiseFrameFileName('fr\u0000am\u0007e\u202e7:*?.jpeg')).toEqual({ ok: true, fileName: 'frame7.jpeg', format: 'jpeg' });
    expect(sanitiseFrameFileName('  ..hidden.jpg ')).toEqual({ ok: true, fileName: 'hidden.jpg', format: 'jpeg' });
  });

  it('refuses a name that is empty once cleaned, and a name without an image extension', () => {
    expect(sanitiseFrameFileName('..\\/\u0001.png')).toEqual({
      ok: false,
      message: 'The file name "..\\\\/\uFFFD.png" is empty once path and control characters are removed; rename the file.',
    });
    expect(sanitiseFrameFileName('notes.txt')).toEqual({
      ok: false,
      message: 'The file "notes.txt" is not an image Paraxia reads: its name must end in .png, .jpg, .jpeg, .tif or .tiff.',
    });
  });

  it('shortens a long name to 200 characters keeping its extension', () => {
    const result = sanitiseFrameFileName(`${'a'.repeat(300)}.png`);
    expect(result.ok && result.fileName.length).toBe(200);
    expect(result.ok && result.fileName.endsWith('a.png')).toBe(true);
  });
});

describe('measurementSetupProblems', () => {
  const sensorSweep = { moving: 'sensor' as const, objectPositionMm: 0, lensPositionMm: 300 };

  it('accepts a complete finite-conjugate set-up', () => {
    expect(measurementSetupProblems({ method: 'finite-conjugate', sweeps: [sensorSweep] }, { nominalFocalLengthMm: 100 })).toEqual([]);
  });

  it('applies the manifest contract: collimator, auxiliary lens, two sweeps for multi-conjugate, the moving part and its positions', () => {
    const paths = (problems: { path: (string | number)[] }[]) => problems.map((p) => p.path.join('.'));
    expect(paths(measurementSetupProblems({ method: 'collimator', sweeps: [{ moving: 'sensor', lensPositionMm: 50 }] }))).toEqual(['collimatorId']);
    expect(paths(measurementSetupProblems({ method: 'auxiliary-lens', sweeps: [sensorSweep] }))).toEqual(['auxiliaryLensId']);
    expect(paths(measurementSetupProblems({ method: 'multi-conjugate', sweeps: [sensorSweep] }))).toEqual(['sweeps']);
    expect(paths(measurementSetupProblems({ method: 'displacement', sweeps: [sensorSweep] }))).toEqual(['sweeps.0.moving']);
    expect(paths(measurementSetupProblems({ method: 'finite-conjugate', sweeps: [{ moving: 'sensor' }] }))).toEqual([
      'sweeps.0.lensPositionMm',
      'sweeps.0.objectPositionMm',
    ]);
  });

  it('words each problem as a sentence naming the sweep or field', () => {
    expect(measurementSetupProblems({ method: 'finite-conjugate', sweeps: [{ moving: 'sensor', objectPositionMm: 0 }] })).toEqual([
      { path: ['sweeps', 0, 'lensPositionMm'], message: 'Sweep 1: lensPositionMm is required when the sensor moves.' },
    ]);
    expect(measurementSetupProblems({ method: 'multi-conjugate', sweeps: [sensorSweep] })[0].message).toBe(
      'The multi-conjugate method needs at least 2 sweeps at different object distances.',
    );
  });

  it('adds the bench rules: order along the rail, distinct object distances, D > 4f (Bessel), and an auxiliary lens for a diverging lens', () => {
    expect(measurementSetupProblems({ method: 'finite-conjugate', sweeps: [{ moving: 'sensor', objectPositionMm: 300, lensPositionMm: 100 }] })[0].path).toEqual([
      'sweeps',
      0,
      'lensPositionMm',
    ]);
    expect(
      measurementSetupProblems({
        method: 'multi-conjugate',
        sweeps: [sensorSweep, { moving: 'sensor', objectPositionMm: 100, lensPositionMm: 400 }],
      })[0].message,
    ).toBe('Sweep 2 has the same object distance (300 mm) as sweep 1; the multi-conjugate method needs different object distances.');
    // Bessel's method needs the object–image distance above four focal lengths (methods.md §6).
    const bessel = (sensorPositionMm: number) =>
      measurementSetupProblems({ method: 'displacement', sweeps: [{ moving: 'lens', objectPositionMm: 0, sensorPositionMm }] }, { nominalFocalLengthMm: 100 });
    expect(bessel(400).map((p) => p.message)).toEqual([
      'Sweep 1: the object–sensor distance (400 mm) must exceed 4 × the nominal focal length (400 mm) for the displacement method.',
    ]);
    expect(bessel(450)).toEqual([]);
    expect(measurementSetupProblems({ method: 'finite-conjugate', sweeps: [sensorSweep] }, { nominalFocalLengthMm: -50 })[0].path).toEqual(['method']);
    expect(measurementSetupProblems({ method: 'finite-conjugate', collimatorId: 'c', sweeps: [sensorSweep] })[0].path).toEqual(['collimatorId']);
  });
});
