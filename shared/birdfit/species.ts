import type { Species } from '../schemas/birdfit';

// Sources (full references in shared/reference/trade-facts.md §1a–§1b of the workspace):
const CLASSIC =
  'US Bureau of Biological Survey table "Dimensions of nesting boxes" (bfnc.ca; Dearborn, Bird Houses and How to Build Them, 1914/1923)';
const EUROPE =
  'Hole: RSPB, NABU (via dpa) and BUND; hole ≥ 125 mm above the floor and mounting 2–4 m: RSPB; floor ≥ 100 mm computed from the 150 mm board, 15–25 mm thick, of BTO/RSPB-style plans';

const IN = 25.4;
const FT = 0.3048;
const mm = (minIn: number, maxIn = minIn) => ({ min: +(minIn * IN).toFixed(1), max: +(maxIn * IN).toFixed(1) });
const m = (minFt: number, maxFt = minFt) => ({ min: +(minFt * FT).toFixed(2), max: +(maxFt * FT).toFixed(2) });

/** European hole nesters share the general box rules; only the hole differs. */
function european(
  id: string,
  commonName: string,
  scientificName: string,
  holeDiameterMm: { min: number; max: number },
  notes: string,
): Species {
  return {
    id,
    commonName,
    scientificName,
    region: 'europe',
    holeDiameterMm,
    floorMm: { min: 100, max: 150 },
    // computed: hole ≥ 125 mm above the floor plus the hole itself
    cavityDepthMm: { min: 125 + holeDiameterMm.max, max: 170 + holeDiameterMm.max },
    holeAboveFloorMm: { min: 125, max: 170 },
    mountingHeightM: { min: 2, max: 4 },
    wanted: true,
    source: EUROPE,
    notes,
  };
}

/**
 * The species table: the box each species uses, as published, one source per row. Ranges hold where sources
 * disagree (the notes say which); single published values have min === max.
 */
export const SPECIES: Species[] = [
  {
    id: 'eastern-bluebird', commonName: 'Eastern Bluebird', scientificName: 'Sialia sialis', region: 'north-america',
    holeDiameterMm: mm(1.5), floorMm: mm(4, 5), cavityDepthMm: mm(8), holeAboveFloorMm: mm(6), mountingHeightM: m(5, 10),
    wanted: true, source: `${CLASSIC}; NABS/TWRA 1½ in hole`,
    notes: 'Floor 4×4 to 5×5 in and depth 5½–8 in in other guides (Texas Master Naturalist). Sawyer gives 1⅝ in, not adopted: a hole over 1½ in admits starlings. Mountain and Western Bluebirds use 1 9/16 in.',
  },
  {
    id: 'black-capped-chickadee', commonName: 'Black-capped Chickadee', scientificName: 'Poecile atricapillus', region: 'north-america',
    holeDiameterMm: mm(1.125), floorMm: mm(4), cavityDepthMm: mm(8, 10), holeAboveFloorMm: mm(6, 8), mountingHeightM: m(6, 15),
    wanted: true, source: CLASSIC, notes: 'Sawyer agrees: 1⅛ in, 8–15 ft.',
  },
  {
    id: 'tufted-titmouse', commonName: 'Tufted Titmouse', scientificName: 'Baeolophus bicolor', region: 'north-america',
    holeDiameterMm: mm(1.25, 1.5), floorMm: mm(4), cavityDepthMm: mm(8, 10), holeAboveFloorMm: mm(6, 8), mountingHeightM: m(6, 15),
    wanted: true, source: CLASSIC, notes: 'Classic table 1¼ in; Sawyer 1½ in.',
  },
  {
    id: 'white-breasted-nuthatch', commonName: 'White-breasted Nuthatch', scientificName: 'Sitta carolinensis', region: 'north-america',
    holeDiameterMm: mm(1.25, 1.5), floorMm: mm(4), cavityDepthMm: mm(8, 10), holeAboveFloorMm: mm(6, 8), mountingHeightM: m(12, 20),
    wanted: true, source: CLASSIC, notes: 'Classic table 1¼ in; Sawyer 1½ in and 12–25 ft.',
  },
  {
    id: 'house-wren', commonName: 'House Wren', scientificName: 'Troglodytes aedon', region: 'north-america',
    holeDiameterMm: mm(1, 1.25), floorMm: mm(4), cavityDepthMm: mm(6, 8), holeAboveFloorMm: mm(1, 6), mountingHeightM: m(6, 10),
    wanted: true, source: CLASSIC, notes: 'Classic table 1¼ in; Sawyer 1 in; other guides 1⅛–1¼ in. Said to prefer an elliptical hole.',
  },
  {
    id: 'carolina-wren', commonName: 'Carolina Wren', scientificName: 'Thryothorus ludovicianus', region: 'north-america',
    holeDiameterMm: mm(1.5), floorMm: mm(4), cavityDepthMm: mm(6, 8), holeAboveFloorMm: mm(1, 6), mountingHeightM: m(6, 10),
    wanted: true, source: CLASSIC, notes: 'Hole above floor 4–6 in on the girlscouts.amesev.com copy.',
  },
  {
    id: 'tree-swallow', commonName: 'Tree Swallow', scientificName: 'Tachycineta bicolor', region: 'north-america',
    holeDiameterMm: mm(1.25, 1.5), floorMm: mm(5), cavityDepthMm: mm(6), holeAboveFloorMm: mm(1, 5), mountingHeightM: m(5, 15),
    wanted: true, source: `${CLASSIC}; TWRA tree swallow box (tn.gov)`,
    notes: 'Classic table 1½ in and 10–15 ft; TWRA 1¼ in with the hole about 5 ft up; Sawyer 1⅜ in and 8–30 ft.',
  },
  {
    id: 'downy-woodpecker', commonName: 'Downy Woodpecker', scientificName: 'Dryobates pubescens', region: 'north-america',
    holeDiameterMm: mm(1.25), floorMm: mm(4), cavityDepthMm: mm(8, 12), holeAboveFloorMm: mm(6, 8), mountingHeightM: m(6, 20),
    wanted: true, source: CLASSIC, notes: 'Depth 8–10 in, 9–12 in on the girlscouts.amesev.com copy.',
  },
  {
    id: 'hairy-woodpecker', commonName: 'Hairy Woodpecker', scientificName: 'Dryobates villosus', region: 'north-america',
    holeDiameterMm: mm(1.5), floorMm: mm(6), cavityDepthMm: mm(12, 15), holeAboveFloorMm: mm(9, 12), mountingHeightM: m(12, 20),
    wanted: true, source: CLASSIC,
  },
  {
    id: 'great-crested-flycatcher', commonName: 'Great Crested Flycatcher', scientificName: 'Myiarchus crinitus', region: 'north-america',
    holeDiameterMm: mm(2, 2.125), floorMm: mm(6), cavityDepthMm: mm(8, 10), holeAboveFloorMm: mm(6, 8), mountingHeightM: m(8, 20),
    wanted: true, source: CLASSIC, notes: 'Sawyer 2⅛ in and 15–40 ft; a SE-US fact sheet says 3 in.',
  },
  {
    id: 'house-finch', commonName: 'House Finch', scientificName: 'Haemorhous mexicanus', region: 'north-america',
    holeDiameterMm: mm(2), floorMm: mm(6), cavityDepthMm: mm(6), holeAboveFloorMm: mm(4), mountingHeightM: m(8, 12),
    wanted: true, source: CLASSIC,
  },
  {
    id: 'purple-martin', commonName: 'Purple Martin (per room)', scientificName: 'Progne subis', region: 'north-america',
    holeDiameterMm: mm(2.125, 2.5), floorMm: mm(6), cavityDepthMm: mm(6), holeAboveFloorMm: mm(1, 2), mountingHeightM: m(12, 20),
    wanted: true, source: CLASSIC, notes: 'Classic table 2½ in, 15–20 ft; Sawyer 2⅛–2½ in, 12–14 ft; girlscouts copy 10–15 ft. Crescent openings keep starlings out.',
  },
  {
    id: 'northern-flicker', commonName: 'Northern Flicker', scientificName: 'Colaptes auratus', region: 'north-america',
    holeDiameterMm: mm(2.5), floorMm: mm(7), cavityDepthMm: mm(16, 18), holeAboveFloorMm: mm(14, 16), mountingHeightM: m(6, 20),
    wanted: true, source: CLASSIC, notes: 'Sawyer 10–35 ft.',
  },
  {
    id: 'eastern-screech-owl', commonName: 'Eastern Screech-Owl', scientificName: 'Megascops asio', region: 'north-america',
    holeDiameterMm: mm(3, 3.25), floorMm: mm(8), cavityDepthMm: mm(12, 15), holeAboveFloorMm: mm(9, 12), mountingHeightM: m(10, 30),
    wanted: true, source: CLASSIC, notes: 'Sawyer 3¼ in.',
  },
  {
    id: 'american-kestrel', commonName: 'American Kestrel', scientificName: 'Falco sparverius', region: 'north-america',
    holeDiameterMm: mm(3), floorMm: mm(8), cavityDepthMm: mm(12, 15), holeAboveFloorMm: mm(9, 12), mountingHeightM: m(10, 30),
    wanted: true, source: CLASSIC, notes: 'Sawyer 20–50 ft.',
  },
  {
    id: 'european-starling-na', commonName: 'European Starling (introduced)', scientificName: 'Sturnus vulgaris', region: 'north-america',
    holeDiameterMm: mm(2), floorMm: mm(6), cavityDepthMm: mm(16, 18), holeAboveFloorMm: mm(14, 16), mountingHeightM: m(10, 25),
    wanted: false, source: CLASSIC, notes: 'Not wanted in North America: it takes cavities from native birds. A 1½ in hole keeps it out (low-authority source).',
  },
  european('blue-tit', 'Blue tit', 'Cyanistes caeruleus', { min: 25, max: 28 }, 'RSPB 25 mm; BUND 26–28 mm; NABU and a French guide 28 mm; National Nest Box Week 26 mm.'),
  european('coal-tit', 'Coal tit', 'Periparus ater', { min: 25, max: 28 }, 'RSPB 25 mm; BUND 26–28 mm; NABU 28 mm.'),
  european('marsh-tit', 'Marsh tit', 'Poecile palustris', { min: 25, max: 28 }, 'RSPB 25 mm; BUND 26–28 mm; NABU 28 mm.'),
  european('great-tit', 'Great tit', 'Parus major', { min: 28, max: 32 }, 'RSPB 28 mm; French guide 30 mm; NABU and BUND 32 mm.'),
  european('tree-sparrow', 'Tree sparrow', 'Passer montanus', { min: 28, max: 36 }, 'RSPB 28 mm; NABU 30 mm; BUND 36 mm.'),
  european('pied-flycatcher', 'Pied flycatcher', 'Ficedula hypoleuca', { min: 28, max: 36 }, 'RSPB 28 mm; NABU 32 mm; BUND 36 mm; a Swedish tit/flycatcher box 35 mm.'),
  european('house-sparrow', 'House sparrow', 'Passer domesticus', { min: 32, max: 36 }, 'RSPB and NABU 32 mm; BUND 36 mm.'),
  european('eurasian-nuthatch', 'Nuthatch', 'Sitta europaea', { min: 32, max: 32 }, 'RSPB, NABU and BUND agree on 32 mm.'),
  {
    ...european('common-starling', 'Starling', 'Sturnus vulgaris', { min: 45, max: 50 }, 'RSPB and BUND 45 mm; Swedish starling box 50 mm hole, 155 × 120 mm floor, 315 mm tall.'),
    floorMm: { min: 120, max: 155 },
    source: `${EUROPE}; floor from the Swedish TrivseBo starling box`,
  },
  {
    ...european('common-redstart', 'Common redstart', 'Phoenicurus phoenicurus', { min: 30, max: 32 }, 'Oval entry: NABU 30 × 45 mm, BUND 32 × 48 mm (width × height).'),
    holeHeightMm: { min: 45, max: 48 },
    cavityDepthMm: { min: 125 + 48, max: 170 + 48 },
  },
];
