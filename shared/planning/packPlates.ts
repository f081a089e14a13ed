/**
 * Packs part footprints of several variants onto as few build plates as it can: first-fit decreasing shelves (rows),
 * each part turned 90° about z when that fits better, every part with a gap around it as the plate rule
 * (shared/analysis/buildPlateFit) counts it: a plate of side B holds parts of side f with gap s while
 * n·(f + s) ≤ B + s.
 */

/** One footprint to place. */
export interface FootprintToPack {
  /** Caller's tag, returned with the placement. */
  key: number;
  widthMm: number;
  depthMm: number;
}

/** A placed footprint: corner (without the gap) and size as placed. */
export interface PackedFootprint {
  key: number;
  xMm: number;
  yMm: number;
  widthMm: number;
  depthMm: number;
  turned: boolean;
}

/** How parts are turned when a shelf is opened. */
type TurnPolicy = 'as-given' | 'turned' | 'flat' | 'tall';

interface Shelf {
  y: number;
  depth: number;
  x: number;
}

interface OpenPlate {
  shelves: Shelf[];
  usedDepth: number;
  parts: PackedFootprint[];
}

/**
 * Packs footprints onto plates, trying four turn policies and keeping the one with fewest plates (on a tie, the
 * fuller first plates). With identical parts this never uses more plates than the grid count of the plate rule.
 * @param items - footprints to place
 * @param plateMm - plate [x, y]
 * @param spacingMm - gap between parts
 * @returns the plates, each a list of placements; throws when a footprint fits no plate in either turn
 */
export function packPlates(
  items: readonly FootprintToPack[],
  plateMm: readonly [number, number],
  spacingMm: number,
): PackedFootprint[][] {
  for (const item of items)
    if (!fitsEitherWay(item, plateMm))
      throw new RangeError(
        `a ${item.widthMm.toFixed(0)} × ${item.depthMm.toFixed(0)} mm part does not fit a ` +
          `${plateMm[0]} × ${plateMm[1]} mm plate`,
      );
  let best: PackedFootprint[][] | undefined;
  for (const policy of ['as-given', 'turned', 'flat', 'tall'] as const) {
    const plates = packWith(items, plateMm, spacingMm, policy);
    if (!best || plates.length < best.length) best = plates;
  }
  return best ?? [];
}

/**
 * Lower bound on the plates any packing needs: total footprint area including the gap, over the plate area
 * including one gap, rounded up.
 * @param items - footprints
 * @param plateMm - plate [x, y]
 * @param spacingMm - gap between parts
 */
export function plateLowerBound(
  items: readonly FootprintToPack[],
  plateMm: readonly [number, number],
  spacingMm: number,
): number {
  const s = spacingMm;
  const area = items.reduce((sum, item) => sum + (item.widthMm + s) * (item.depthMm + s), 0);
  return Math.ceil(area / ((plateMm[0] + s) * (plateMm[1] + s)) - 1e-9);
}

function fitsEitherWay(item: FootprintToPack, [bx, by]: readonly [number, number]): boolean {
  return (item.widthMm <= bx && item.depthMm <= by) || (item.depthMm <= bx && item.widthMm <= by);
}

const EPS = 1e-9;

function packWith(
  items: readonly FootprintToPack[],
  [bx, by]: readonly [number, number],
  s: number,
  policy: TurnPolicy,
): PackedFootprint[][] {
  const plateX = bx + s;
  const plateY = by + s;
  // Cells include the gap; the plate grows by one gap so the last part needs none.
  const cells = items.map((item) => {
    const w = item.widthMm + s;
    const d = item.depthMm + s;
    const straightOk = w <= plateX + EPS && d <= plateY + EPS;
    const turnedOk = d <= plateX + EPS && w <= plateY + EPS;
    let turn: boolean;
    if (policy === 'as-given') turn = !straightOk;
    else if (policy === 'turned') turn = turnedOk;
    else if (policy === 'flat') turn = (d > w && turnedOk) || !straightOk;
    else turn = (w > d && turnedOk) || !straightOk;
    return { item, w: turn ? d : w, d: turn ? w : d, turn, straightOk, turnedOk };
  });
  cells.sort((a, b) => b.d - a.d || b.w - a.w || a.item.key - b.item.key);

  const plates: OpenPlate[] = [];
  for (const cell of cells) {
    if (!placeInExistingShelf(plates, cell, plateX)) openShelf(plates, cell, plateX, plateY);
  }
  return plates.map((plate) => plate.parts);
}

interface Cell {
  item: FootprintToPack;
  w: number;
  d: number;
  turn: boolean;
  straightOk: boolean;
  turnedOk: boolean;
}

/** First shelf (oldest plate first) with room, trying the cell's turn and then the other one. */
function placeInExistingShelf(plates: OpenPlate[], cell: Cell, plateX: number): boolean {
  const ways: Array<[number, number, boolean]> = [[cell.w, cell.d, cell.turn]];
  const otherOk = cell.turn ? cell.straightOk : cell.turnedOk;
  if (otherOk) ways.push([cell.d, cell.w, !cell.turn]);
  for (const plate of plates)
    for (const shelf of plate.shelves)
      for (const [w, d, turned] of ways)
        if (shelf.x + w <= plateX + EPS && d <= shelf.depth + EPS) {
          place(plate, shelf, cell, w, d, turned);
          return true;
        }
  return false;
}

/** A new shelf on the first plate with depth left, else on a new plate. */
function openShelf(plates: OpenPlate[], cell: Cell, plateX: number, plateY: number): void {
  for (const plate of plates)
    if (plate.usedDepth + cell.d <= plateY + EPS && cell.w <= plateX + EPS) {
      const shelf = { y: plate.usedDepth, depth: cell.d, x: 0 };
      plate.shelves.push(shelf);
      plate.usedDepth += cell.d;
      place(plate, shelf, cell, cell.w, cell.d, cell.turn);
      return;
    }
  const plate: OpenPlate = { shelves: [], usedDepth: 0, parts: [] };
  plates.push(plate);
  const shelf = { y: 0, depth: cell.d, x: 0 };
  plate.shelves.push(shelf);
  plate.usedDepth = cell.d;
  place(plate, shelf, cell, cell.w, cell.d, cell.turn);
}

function place(plate: OpenPlate, shelf: Shelf, cell: Cell, w: number, d: number, turned: boolean): void {
  const s = w - (turned ? cell.item.depthMm : cell.item.widthMm);
  plate.parts.push({
    key: cell.item.key,
    xMm: shelf.x,
    yMm: shelf.y,
    widthMm: w - s,
    depthMm: d - s,
    turned,
  });
  shelf.x += w;
}
