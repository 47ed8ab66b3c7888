import { describe, expect, it } from 'vitest';
import { cellName, checkCellValue, parseCell, saveCellSchema } from './marking.js';

// The cell names and value rules are this project's own protocol (design.md §7); no outside source.
describe('mark sheet cells', () => {
  it('parses every kind of cell and refuses anything else', () => {
    expect(parseCell(cellName.mark(2, 'evenness'))).toEqual({
      kind: 'mark',
      request: 2,
      part: 'evenness',
    });
    expect(parseCell(cellName.flag(0, 'slip'))).toEqual({ kind: 'flag', request: 0, part: 'slip' });
    expect(parseCell(cellName.comment('overall'))).toEqual({
      kind: 'comment',
      request: null,
      part: null,
    });
    expect(parseCell(cellName.asked(11))).toEqual({ kind: 'asked', request: 11, part: null });
    expect(parseCell('outcome')).toEqual({ kind: 'outcome', request: null, part: null });
    for (const bad of [
      'mark:0',
      'flag:0:sneeze',
      'mark:x:key',
      'comment:',
      'mark:0:Key',
      'outcome:1',
      '',
    ])
      expect(parseCell(bad), bad).toBeNull();
  });

  it('checks values by kind', () => {
    expect(checkCellValue('mark', 7)).toBeNull();
    expect(checkCellValue('mark', null)).toBeNull();
    expect(checkCellValue('mark', 2.5)).not.toBeNull();
    expect(checkCellValue('mark', 11)).not.toBeNull();
    expect(checkCellValue('flag', -1)).not.toBeNull();
    expect(checkCellValue('asked', 'no')).not.toBeNull();
    expect(checkCellValue('outcome', 'absent')).toBeNull();
    expect(checkCellValue('outcome', 'gone')).not.toBeNull();
  });

  it('names the value field when a save has the wrong shape', () => {
    const r = saveCellSchema.safeParse({
      changeId: crypto.randomUUID(),
      cell: 'flag:0:slip',
      value: 'three',
      baseVersion: 0,
    });
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => i.path.join('.'))).toEqual(['value']);
    expect(
      saveCellSchema.safeParse({
        changeId: 'x',
        cell: 'outcome',
        value: null,
        baseVersion: 0,
        extra: 1,
      }).success,
    ).toBe(false);
  });
});
