// Herbicide actives a food-plot burndown or stand clean-up uses: what each kills, whether it stays active in
// the soil, how long it must stay dry on the leaf, how long to wait before working or burning the ground, and
// how long before each kind of crop may be sown (the plant-back, or replant, interval). Every number is the
// typical label or extension value with its source, and every one is only typical: the label on your jug is
// the law — products, formulations and rates differ, and the label's own interval always wins.
import { getSpecies, type BlendPart, type Species } from './species';

/** What the active kills. Non-selective actives list all three. */
export type WeedTarget = 'grass' | 'broadleaf' | 'woody';

/** Crop groups as plant-back tables name them. */
export type CropGroup = 'legumes' | 'soybeans' | 'brassicas' | 'small-grains' | 'corn' | 'sorghum' | 'other';

export const CROP_GROUP_WORDS: Record<CropGroup, string> = {
  legumes: 'clovers and other legumes',
  soybeans: 'soybeans',
  brassicas: 'brassicas (turnips, rape, radish)',
  'small-grains': 'small grains (rye, wheat, oats)',
  corn: 'corn',
  sorghum: 'grain sorghum',
  other: 'other broadleaf forage (chicory, buckwheat)',
};

export interface SourcedDays {
  days: number;
  source: string;
}

export interface HerbicideActive {
  id: string;
  name: string;
  controls: WeedTarget[];
  /** Stays active in the soil and can injure seedlings sown into it. */
  soilActive: boolean;
  soilActivitySource: string;
  rainfastHours: number;
  rainfastSource: string;
  /** Days after spraying before tillage or a burn (the kill has to move down into the roots first). */
  killWaitDays: number;
  killWaitSource: string;
  /** Days from spraying to sowing each crop group. */
  plantBack: Record<CropGroup, SourcedDays>;
  /** Groups whose established stand tolerates it sprayed over the top (a selective clean-up). */
  safeOverStandsOf: CropGroup[];
  safeOverSource: string;
}

export const LABEL_IS_THE_LAW = 'typical values; the label on your jug is the law';

const MEMORY = 'from memory (label language recalled, not checked against the label)';
const PENN_STATE_24D =
  'Penn State Extension (Curran), "Including 2,4-D in the Burndown" (2017): labels say plant only labeled crops within 29 days ' +
  'of a fallow application and all others after 30 days; a label table gives corn 7–14, sorghum 29, soybeans 7–15, small grains 29, ' +
  'all other crops 30 days; any crop after 90 days of soil above freezing';
const ISU_24D_SOY =
  'Iowa State University weed specialists (2006) / Illinois IPM Bulletin (2012): 2,4-D ester up to 0.5 lb ae/acre (1 pint of a ' +
  '4 lb/gal product) at least 7 days before soybeans; up to 1 lb ae, 15–30 days depending on the product';
const ILLINOIS_24D_TILL = 'Illinois IPM Bulletin (Hager, 2012): some 2,4-D ester labels allow no tillage for at least 7 days after application';
const MSU_DICAMBA =
  'Mississippi State Extension (Bond), "Auxin Herbicide Plantback Restrictions" (2015), quoting the dicamba (Clarity) label: corn any ' +
  'time before planting; soybeans 14 days after 8 fl oz/acre or 28 days after 16 fl oz/acre, counted after 1 in of rain; sorghum 15 days';
const CLARITY_TILL = 'dicamba (Clarity) label as listed by Greenbook: do not cultivate within 7 days after applying';
const GLYPHOSATE_LABEL = 'glyphosate labels (Greenbook listing): a systemic herbicide with no soil residual activity';
const GLYPHOSATE_CROPWATCH = 'University of Nebraska CropWatch (Anderson, 2014): glyphosate is the exception with no rotational restriction';
const NDSU_GLYPHOSATE_TILL =
  'NDSU Crop & Pest Report, "Minimum Time Between Herbicide Application and Tillage" (2016): about 5 days from glyphosate to tillage, ' +
  '3 in warm weather; labels ask up to 7 days for perennial weeds (' + MEMORY + ')';
const GANNON =
  'Gannon & Yelverton (2008), Weed Technology 22:553: glyphosate ≥ 90 % control with 60 rain-free minutes; generic 41 % labels ask ' +
  'up to 6 hours (' + MEMORY + ')';
const SELECT_LABEL =
  'clethodim (Select 2 EC) label: do not apply if rain is expected within 1 hour; do not plant rotational crops until 30 days after ' +
  'application unless the crop is listed on the label';
const CLETHODIM_LISTED = 'clethodim labels list alfalfa, clover and soybeans as crops it may be sprayed over (' + MEMORY + ')';
const SETHOXYDIM = 'sethoxydim (Poast) label: labeled crops any time, other crops 30 days after application (' + MEMORY + ')';
const PURDUE_SELECTMAX = 'Purdue (SelectMax label note): grass dies slowly, yellowing in about a week; do not mow two weeks before or after';
const PNW_IMAZETHAPYR =
  'Pacific Northwest Weed Management Handbook, imazethapyr (Pursuit) in peas: rotation 18 months for sweet corn, oat and sorghum; ' +
  'labeled for alfalfa, clover, soybeans and other edible legumes';
const MOYER_ESAU = 'Moyer & Esau (1996), Weed Technology: imazethapyr carryover risks canola up to two years and wheat a year later';
const IMAZETHAPYR_MEMORY = 'imazethapyr (Pursuit) label: wheat and rye 4 months, field corn 8.5 months, canola 40 months (' + MEMORY + ')';
const PARAQUAT =
  'paraquat labels: a contact herbicide bound at once by soil clay, with no soil activity; rainfast in 30 minutes; plant any time (' + MEMORY + ')';
const GLUFOSINATE =
  'glufosinate (Liberty 280) label: canola, corn and soybeans any time; small grains and sorghum 70 days; other crops 120 days; ' +
  'rainfast 4 hours (' + MEMORY + ')';
const TRICLOPYR =
  'triclopyr ester (Remedy, Garlon 4) labels: grasses may be seeded about 3 weeks after application; broadleaf crops and legumes are ' +
  'injured for months (' + MEMORY + ')';
const TRICLOPYR_SELECTIVE = 'Pacific Northwest Weed Management Handbook: triclopyr controls broadleaf and woody plants and spares grasses';
const AUXIN_GRASS_SAFE = 'a growth-regulator (auxin) herbicide: grass crops tolerate it, broadleaf crops and legumes do not (WSSA Group 4)';

function same(days: number, source: string): Record<CropGroup, SourcedDays> {
  return { legumes: { days, source }, soybeans: { days, source }, brassicas: { days, source }, 'small-grains': { days, source }, corn: { days, source }, sorghum: { days, source }, other: { days, source } };
}

/** 2,4-D labels' fallow plant-backs (Penn State's table); the soybean interval differs by formulation. */
function twoFourDPlantBack(soybeans: SourcedDays): Record<CropGroup, SourcedDays> {
  const penn = (days: number) => ({ days, source: PENN_STATE_24D });
  return { legumes: penn(30), soybeans, brassicas: penn(30), 'small-grains': penn(29), corn: penn(14), sorghum: penn(29), other: penn(30) };
}

const CATALOG: HerbicideActive[] = [
  {
    id: 'glyphosate',
    name: 'glyphosate',
    controls: ['grass', 'broadleaf', 'woody'],
    soilActive: false,
    soilActivitySource: GLYPHOSATE_LABEL,
    rainfastHours: 6,
    rainfastSource: GANNON,
    killWaitDays: 7,
    killWaitSource: NDSU_GLYPHOSATE_TILL,
    plantBack: same(0, `${GLYPHOSATE_LABEL}; ${GLYPHOSATE_CROPWATCH}`),
    safeOverStandsOf: [],
    safeOverSource: 'non-selective: it kills any green plant it wets',
  },
  {
    id: '2,4-d-ester',
    name: '2,4-D ester',
    controls: ['broadleaf', 'woody'],
    soilActive: true,
    soilActivitySource: 'Illinois IPM Bulletin (2012): moved into the soil by rain it can severely injure germinating crop seed; esters less so than amines',
    rainfastHours: 1,
    rainfastSource: `ester formulations are rainfast in about an hour (${MEMORY})`,
    killWaitDays: 7,
    killWaitSource: ILLINOIS_24D_TILL,
    plantBack: twoFourDPlantBack({ days: 7, source: ISU_24D_SOY }),
    safeOverStandsOf: ['small-grains', 'corn', 'sorghum'],
    safeOverSource: AUXIN_GRASS_SAFE,
  },
  {
    id: '2,4-d-amine',
    name: '2,4-D amine',
    controls: ['broadleaf', 'woody'],
    soilActive: true,
    soilActivitySource: 'Illinois IPM Bulletin (2012): amines are more water-soluble than esters, so rain moves them into the seed zone more readily',
    rainfastHours: 6,
    rainfastSource: `amine formulations need about 6 rain-free hours (${MEMORY})`,
    killWaitDays: 7,
    killWaitSource: ILLINOIS_24D_TILL,
    plantBack: twoFourDPlantBack({ days: 15, source: `${ISU_24D_SOY}; amine labels carry the longer soybean interval (${MEMORY})` }),
    safeOverStandsOf: ['small-grains', 'corn', 'sorghum'],
    safeOverSource: AUXIN_GRASS_SAFE,
  },
  {
    id: 'dicamba',
    name: 'dicamba',
    controls: ['broadleaf', 'woody'],
    soilActive: true,
    soilActivitySource: `${MSU_DICAMBA}; the soybean interval counts only after 1 in of rain has moved it through the soil`,
    rainfastHours: 4,
    rainfastSource: `dicamba salt labels: about 4 rain-free hours (${MEMORY})`,
    killWaitDays: 7,
    killWaitSource: CLARITY_TILL,
    plantBack: {
      legumes: { days: 120, source: `dicamba labels: broadleaf crops not listed wait months (${MEMORY})` },
      soybeans: { days: 28, source: MSU_DICAMBA },
      brassicas: { days: 120, source: `dicamba labels: broadleaf crops not listed wait months (${MEMORY})` },
      'small-grains': { days: 45, source: `dicamba labels: small grains after a fallow application (${MEMORY})` },
      corn: { days: 0, source: MSU_DICAMBA },
      sorghum: { days: 15, source: MSU_DICAMBA },
      other: { days: 120, source: `dicamba labels: broadleaf crops not listed wait months (${MEMORY})` },
    },
    safeOverStandsOf: ['small-grains', 'corn', 'sorghum'],
    safeOverSource: AUXIN_GRASS_SAFE,
  },
  {
    id: 'triclopyr',
    name: 'triclopyr',
    controls: ['broadleaf', 'woody'],
    soilActive: true,
    soilActivitySource: TRICLOPYR,
    rainfastHours: 2,
    rainfastSource: `triclopyr ester labels: about 2 rain-free hours (${MEMORY})`,
    killWaitDays: 14,
    killWaitSource: `woody brush browns out over weeks; cut or burn only once it has (${MEMORY})`,
    plantBack: {
      legumes: { days: 90, source: TRICLOPYR },
      soybeans: { days: 90, source: TRICLOPYR },
      brassicas: { days: 90, source: TRICLOPYR },
      'small-grains': { days: 21, source: TRICLOPYR },
      corn: { days: 21, source: TRICLOPYR },
      sorghum: { days: 21, source: TRICLOPYR },
      other: { days: 90, source: TRICLOPYR },
    },
    safeOverStandsOf: ['small-grains', 'corn', 'sorghum'],
    safeOverSource: TRICLOPYR_SELECTIVE,
  },
  {
    id: 'clethodim',
    name: 'clethodim',
    controls: ['grass'],
    soilActive: false,
    soilActivitySource: `${SELECT_LABEL}; a foliar grass herbicide`,
    rainfastHours: 1,
    rainfastSource: SELECT_LABEL,
    killWaitDays: 14,
    killWaitSource: PURDUE_SELECTMAX,
    plantBack: {
      legumes: { days: 0, source: CLETHODIM_LISTED },
      soybeans: { days: 0, source: CLETHODIM_LISTED },
      brassicas: { days: 30, source: SELECT_LABEL },
      'small-grains': { days: 30, source: SELECT_LABEL },
      corn: { days: 30, source: SELECT_LABEL },
      sorghum: { days: 30, source: SELECT_LABEL },
      other: { days: 30, source: SELECT_LABEL },
    },
    safeOverStandsOf: ['legumes', 'soybeans', 'brassicas', 'other'],
    safeOverSource: 'clethodim (Select 2 EC) label: controls annual and perennial grasses; does not control broadleaf weeds — broadleaf stands are spared',
  },
  {
    id: 'sethoxydim',
    name: 'sethoxydim',
    controls: ['grass'],
    soilActive: false,
    soilActivitySource: SETHOXYDIM,
    rainfastHours: 1,
    rainfastSource: `sethoxydim (Poast) label: rainfast in 1 hour (${MEMORY})`,
    killWaitDays: 14,
    killWaitSource: `grass herbicides of this family kill slowly, over one to three weeks (${MEMORY})`,
    plantBack: {
      legumes: { days: 0, source: SETHOXYDIM },
      soybeans: { days: 0, source: SETHOXYDIM },
      brassicas: { days: 30, source: SETHOXYDIM },
      'small-grains': { days: 30, source: SETHOXYDIM },
      corn: { days: 30, source: SETHOXYDIM },
      sorghum: { days: 30, source: SETHOXYDIM },
      other: { days: 30, source: SETHOXYDIM },
    },
    safeOverStandsOf: ['legumes', 'soybeans', 'brassicas', 'other'],
    safeOverSource: 'Pacific Northwest Weed Management Handbook: sethoxydim is a grass-selective (Group 1) herbicide; broadleaf crops are spared',
  },
  {
    id: 'imazethapyr',
    name: 'imazethapyr',
    controls: ['grass', 'broadleaf'],
    soilActive: true,
    soilActivitySource: `${MOYER_ESAU}; Pursuit label: residual control of germinating weeds`,
    rainfastHours: 1,
    rainfastSource: `imazethapyr (Pursuit) label: rainfast in 1 hour (${MEMORY})`,
    killWaitDays: 7,
    killWaitSource: `a slow systemic herbicide; as glyphosate (${MEMORY})`,
    plantBack: {
      legumes: { days: 0, source: PNW_IMAZETHAPYR },
      soybeans: { days: 0, source: PNW_IMAZETHAPYR },
      brassicas: { days: 1200, source: `${IMAZETHAPYR_MEMORY}; ${MOYER_ESAU}` },
      'small-grains': { days: 540, source: `${PNW_IMAZETHAPYR} (oats, the longest of the group); ${IMAZETHAPYR_MEMORY}` },
      corn: { days: 255, source: IMAZETHAPYR_MEMORY },
      sorghum: { days: 540, source: PNW_IMAZETHAPYR },
      other: { days: 540, source: `University of Nebraska CropWatch: a crop the label does not list takes the maximum interval, usually 18 months` },
    },
    safeOverStandsOf: ['legumes', 'soybeans'],
    safeOverSource: PNW_IMAZETHAPYR,
  },
  {
    id: 'paraquat',
    name: 'paraquat',
    controls: ['grass', 'broadleaf'],
    soilActive: false,
    soilActivitySource: PARAQUAT,
    rainfastHours: 0.5,
    rainfastSource: PARAQUAT,
    killWaitDays: 3,
    killWaitSource: `a contact burndown: leaves brown within days, roots of perennials can regrow (${MEMORY})`,
    plantBack: same(0, PARAQUAT),
    safeOverStandsOf: [],
    safeOverSource: 'non-selective: burns any green tissue it wets (restricted use: a certified applicator only)',
  },
  {
    id: 'glufosinate',
    name: 'glufosinate',
    controls: ['grass', 'broadleaf'],
    soilActive: false,
    soilActivitySource: GLUFOSINATE,
    rainfastHours: 4,
    rainfastSource: GLUFOSINATE,
    killWaitDays: 5,
    killWaitSource: `University of Minnesota Extension (2024): a contact herbicide; weeds die within a week (${MEMORY} for the days)`,
    plantBack: {
      legumes: { days: 120, source: GLUFOSINATE },
      soybeans: { days: 0, source: GLUFOSINATE },
      brassicas: { days: 0, source: `${GLUFOSINATE} (canola; other brassicas are not listed)` },
      'small-grains': { days: 70, source: GLUFOSINATE },
      corn: { days: 0, source: GLUFOSINATE },
      sorghum: { days: 70, source: GLUFOSINATE },
      other: { days: 120, source: GLUFOSINATE },
    },
    safeOverStandsOf: [],
    safeOverSource: 'non-selective contact herbicide, except over glufosinate-tolerant crops',
  },
];

export const HERBICIDE_ACTIVES: readonly HerbicideActive[] = Object.freeze(CATALOG);
export const HERBICIDE_ACTIVE_IDS: readonly string[] = Object.freeze(CATALOG.map((a) => a.id));

const BY_ID = new Map(CATALOG.map((a) => [a.id, a]));

export function isHerbicideActive(id: string): boolean {
  return BY_ID.has(id);
}

export function getHerbicideActive(id: string): HerbicideActive {
  const active = BY_ID.get(id);
  if (!active) throw new Error(`Unknown herbicide active "${id}". Known actives: ${HERBICIDE_ACTIVE_IDS.join(', ')}.`);
  return active;
}

/** The plant-back table's group for a species: its catalog kind, with corn, sorghum and soybeans by id. */
export function cropGroupOf(species: Species): CropGroup {
  if (species.id === 'soybeans') return 'soybeans';
  if (species.id === 'corn') return 'corn';
  if (species.id === 'grain-sorghum') return 'sorghum';
  switch (species.kind) {
    case 'clover':
    case 'legume':
      return 'legumes';
    case 'brassica':
      return 'brassicas';
    case 'grain':
    case 'grass':
      return 'small-grains';
    default:
      return 'other';
  }
}

export function blendCropGroups(blend: BlendPart[]): CropGroup[] {
  return [...new Set(blend.map((p) => cropGroupOf(getSpecies(p.speciesId))))];
}

export interface MixPlantBack {
  days: number;
  active: HerbicideActive;
  group: CropGroup;
  source: string;
}

/** The longest plant-back of a mix across the blend's crop groups; null when nothing in the mix holds seeding back. */
export function longestPlantBack(activeIds: readonly string[], groups: readonly CropGroup[]): MixPlantBack | null {
  let worst: MixPlantBack | null = null;
  for (const id of activeIds) {
    const active = getHerbicideActive(id);
    for (const group of groups) {
      const { days, source } = active.plantBack[group];
      if (days > 0 && (!worst || days > worst.days)) worst = { days, active, group, source };
    }
  }
  return worst;
}

/** The mix's kill wait before tillage or a burn: the longest of its actives. */
export function mixKillWait(activeIds: readonly string[]): { days: number; active: HerbicideActive } | null {
  let worst: { days: number; active: HerbicideActive } | null = null;
  for (const id of activeIds) {
    const active = getHerbicideActive(id);
    if (!worst || active.killWaitDays > worst.days) worst = { days: active.killWaitDays, active };
  }
  return worst;
}

/** The mix's rain-free hours: the longest of its actives. */
export function mixRainfastHours(activeIds: readonly string[]): { hours: number; active: HerbicideActive } | null {
  let worst: { hours: number; active: HerbicideActive } | null = null;
  for (const id of activeIds) {
    const active = getHerbicideActive(id);
    if (!worst || active.rainfastHours > worst.hours) worst = { hours: active.rainfastHours, active };
  }
  return worst;
}

/** Kills every green plant it wets (glyphosate, paraquat, glufosinate): a burndown, not a clean-up. */
export function isNonSelective(active: HerbicideActive): boolean {
  return active.safeOverStandsOf.length === 0 && active.controls.includes('grass') && active.controls.includes('broadleaf');
}

/** Actives of the mix that would injure an established stand of the blend's crop groups. */
export function activesHarmingStand(activeIds: readonly string[], groups: readonly CropGroup[]): { active: HerbicideActive; group: CropGroup }[] {
  const out: { active: HerbicideActive; group: CropGroup }[] = [];
  for (const id of activeIds) {
    const active = getHerbicideActive(id);
    const group = groups.find((g) => !active.safeOverStandsOf.includes(g));
    if (group) out.push({ active, group });
  }
  return out;
}

/** "2,4-D ester + glyphosate" */
export function mixName(activeIds: readonly string[]): string {
  return activeIds.map((id) => getHerbicideActive(id).name).join(' + ');
}
