// A rectangular cell selection (anchor + moving corner) over row and column positions, and fill-down.
import type { CellValue } from "@/lib/grid/tables";

export interface CellPos {
  row: number;
  col: number;
}

export interface CellRange {
  top: number;
  bottom: number;
  left: number;
  right: number;
}

export function rangeOf(anchor: CellPos, corner: CellPos): CellRange {
  return {
    top: Math.min(anchor.row, corner.row),
    bottom: Math.max(anchor.row, corner.row),
    left: Math.min(anchor.col, corner.col),
    right: Math.max(anchor.col, corner.col),
  };
}

export function contains(r: CellRange, p: CellPos): boolean {
  return p.row >= r.top && p.row <= r.bottom && p.col >= r.left && p.col <= r.right;
}

export function cellCount(r: CellRange): number {
  return (r.bottom - r.top + 1) * (r.right - r.left + 1);
}

/** Moves the corner by one step, kept inside the grid (Shift+arrow). */
export function extend(corner: CellPos, dRow: number, dCol: number, rows: number, cols: number): CellPos {
  return {
    row: Math.max(0, Math.min(rows - 1, corner.row + dRow)),
    col: Math.max(0, Math.min(cols - 1, corner.col + dCol)),
  };
}

/**
 * Fill-down (Ctrl+D): every cell of the range takes the value of the range's top cell in its column;
 * a one-row range copies from the row above, as spreadsheets do. Returns the cells to set.
 */
export function fillDown(r: CellRange, valueAt: (p: CellPos) => CellValue): Array<{ pos: CellPos; value: CellValue }> {
  const sourceRow = r.top === r.bottom ? r.top - 1 : r.top;
  if (sourceRow < 0) return [];
  const out: Array<{ pos: CellPos; value: CellValue }> = [];
  for (let col = r.left; col <= r.right; col++) {
    const value = valueAt({ row: sourceRow, col });
    for (let row = sourceRow + 1; row <= r.bottom; row++) out.push({ pos: { row, col }, value });
  }
  return out;
}
