// Food-plot species catalog. Every number carries where it came from, so a planting plan can say why it
// asks for 45 °F soil or 5 lb of seed. "From memory" means general extension guidance recalled, not checked
// against a publication; "common practice, no source" means trade practice with no publication behind it here.
import { SQ_FT_PER_ACRE } from './units';

export interface Sourced<T> {
  value: T;
  source: string;
}
export type SeasonKind = 'cool' | 'warm';
/** tender: killed by about 32 °F; light: survives a light frost; hardy: survives hard freezes. */
export type FrostTolerance = 'tender' | 'light' | 'hardy';

export interface Species {
  id: string;
  name: string;
  kind: 'clover' | 'legume' | 'brassica' | 'grain' | 'forb' | 'grass';
  season: SeasonKind;
  lifeCycle: 'annual' | 'biennial' | 'perennial';
  /** Minimum soil temperature at seeding depth for germination. */
  minSoilTempF: Sourced<number>;
  optimumSoilTempF: Sourced<[number, number]>;
  /** Pure stand. */
  broadcastRateLbPerAcre: Sourced<[number, number]>;
  drilledRateLbPerAcre: Sourced<[number, number]>;
  seedDepthIn: Sourced<[number, number]>;
  /** At optimum soil temperature. */
  daysToEmergence: Sourced<[number, number]>;
  frostTolerance: Sourced<FrostTolerance>;
  /** Weeks before the average first fall frost that a fall planting needs. */
  fallWeeksBeforeFirstFrost: Sourced<number>;
  /** A good stand from the broadcast rate, for germination checks. */
  expectedStandPlantsPerSqFt: Sourced<[number, number]>;
  seedsPerLb: Sourced<number>;
  /** Suited to frost seeding into an existing stand (clovers). */
  frostSeedable: boolean;
  /** Frost seeding into an existing stand, where a published rate exists (lib/agronomy/seeding-rate.ts uses it). */
  frostSeedingRateLbPerAcre?: Sourced<[number, number]>;
}

const MEMORY = 'from memory (general extension guidance, not checked against a publication)';
const COMMON = 'common practice, no source';
const ALABAMA_BALL =
  'Alabama Dept. of Conservation and Natural Resources, deer management manual, forage plantings appendix (citing Ball et al.); secondary';
const MSU_UGA_CRIMSON = 'Michigan State University Extension / University of Georgia, crimson clover guidance; secondary';
const SARE = 'SARE, Managing Cover Crops Profitably (3rd ed.); secondary';
const NDSU = 'NDSU Extension, soil temperature for planting; secondary';
const NDSU_OPTIMUM = 'NDSU Extension: optimum 5–10 °F above the minimum; secondary';
const NDSU_UMN_ALFALFA = 'NDSU Extension / University of Minnesota Extension, alfalfa establishment; secondary';
const CORNELL_BUCKWHEAT = 'Cornell University (Björkman), buckwheat cover crop guidance: sow after soil reaches 65 °F';
const OSU_TURNIP = 'Ohio State University Extension fact sheet ANR-0124, Forage Turnip as a Cover Crop in Ohio (2023)';
const OSU_RADISH = 'Ohio State University Extension fact sheet ANR-0125, Radish as a Cover Crop in Ohio';
const OSU_CRIMSON = 'Ohio State University Extension fact sheet ANR-0129, Crimson Clover as a Cover Crop in Ohio';
const OSU_RED_CLOVER = 'Ohio State University Extension fact sheet ANR-0132, Red Clover as a Cover Crop in Ohio';
const OSU_BRASSICA_RATES =
  'Ohio State University Extension, Penrose (2003), Brassicas: turnips 1.5–2.0 lb/acre drilled or broadcast and cultipacked';
const OSU_BRASSICA_DAYS =
  'derived from Ohio State University Extension, Penrose (2003): brassicas reach top quality in about 60 days, rounded to 8 weeks; tops survive 15–20 °F';
const UGA_RADISH = 'University of Georgia, Conservation Tillage: Cover Crops, oilseed radish (10–12 drilled, 12–15 broadcast)';
const PENN_STATE_CHICORY = 'Penn State Extension, Chicory Establishment (depth ¼–½ in; frost seeding into pasture described)';
const HARRINGTON =
  'Harrington, Soil Temperature Conditions for Vegetable Seed Germination, as reprinted by Oregon State University Extension';
// Wildlife food plot guides (rates in lb/acre of pure stands; drill and broadcast given separately).
const MSU_M1591 =
  'Mississippi State University Extension M1591, Deer Food Plot Planting Guide for the Southeast (planting rate table, drill and broadcast)';
const UF_IFAS_TAYLOR =
  'UF/IFAS Extension Taylor County, Wildlife and Game Food Plots: planting dates, seeding rates and depths for cool-season forage crops (north Florida)';
const PENN_STATE_WHITE_CLOVER =
  'Penn State Extension (Forages), White Clover Establishment: no deeper than ¼ in; 2–4 lb/acre into an existing grass pasture';
// Frost seeding clover into an existing stand. The extension columns are secondary (agents quoting the specialists).
const FROST_WHITE_CLOVER =
  'frost seeding 1–2 lb/acre of white clover: University of Kentucky Cooperative Extension county column "Six easy steps … clover frost seeding" (2024, secondary); ' +
  'Penn State Extension gives 2–4 lb/acre into grass pasture, and University of Missouri Extension (Roberts, quoted 2020) ¼ lb/acre of ladino';
const FROST_RED_CLOVER =
  'frost seeding 6–8 lb/acre of red clover: University of Kentucky Cooperative Extension county column (2024: "six pounds of red clover", secondary); ' +
  'University of Missouri Extension (Roberts, quoted 2020): 8 lb/acre; WVU Extension, Rayburn (1995), Frost and Walk-in Clover Seedings: 2–4 lb/acre when over-seeding every year or two';

const CORNELL_BUCKWHEAT_WEEKS =
  'derived from Cornell University (Björkman): as a cover crop buckwheat is in the ground 35–40 days; rounded up to 6 weeks';

/**
 * Share of broadcast seed that makes a plant. Sowcast's own assumption for germination checks (no source):
 * broadcast seed lies unevenly and partly uncovered, so well under all of it establishes.
 */
export const BROADCAST_ESTABLISHMENT_FRACTION: Sourced<[number, number]> = {
  value: [0.3, 0.6],
  source: `${COMMON}: Sowcast assumes 30–60 % of broadcast seed establishes`,
};

function s<T>(value: T, source: string): Sourced<T> {
  return { value, source };
}

type SpeciesInput = Omit<Species, 'expectedStandPlantsPerSqFt'>;

/** Stand expected from the broadcast midpoint: seeds per ft² times the establishment fraction. */
function withStand(input: SpeciesInput): Species {
  const [low, high] = input.broadcastRateLbPerAcre.value;
  const seedsPerSqFt = (((low + high) / 2) * input.seedsPerLb.value) / SQ_FT_PER_ACRE;
  const [fLow, fHigh] = BROADCAST_ESTABLISHMENT_FRACTION.value;
  const round1 = (x: number) => Math.round(x * 10) / 10;
  return {
    ...input,
    expectedStandPlantsPerSqFt: s(
      [round1(seedsPerSqFt * fLow), round1(seedsPerSqFt * fHigh)],
      `derived: broadcast-rate midpoint × seeds per lb ÷ ${SQ_FT_PER_ACRE.toLocaleString('en-US')} ft² per acre × ` +
        `establishment ${fLow * 100}–${fHigh * 100} % (${COMMON})`,
    ),
  };
}

const CATALOG: SpeciesInput[] = [
  {
    id: 'white-clover',
    name: 'White clover (ladino type)',
    kind: 'clover',
    season: 'cool',
    lifeCycle: 'perennial',
    minSoilTempF: s(40, MEMORY),
    optimumSoilTempF: s([55, 75], MEMORY),
    // The guides differ: 4–6 (Alabama, citing Ball et al.) and 8 (MSU M1591) broadcast; the range spans both.
    broadcastRateLbPerAcre: s([4, 8], `4–6: ${ALABAMA_BALL}; 8: ${MSU_M1591}`),
    drilledRateLbPerAcre: s([3, 4], `${ALABAMA_BALL}; ${MSU_M1591}: 4; ${UF_IFAS_TAYLOR}: 3–4`),
    seedDepthIn: s([0.125, 0.25], `${PENN_STATE_WHITE_CLOVER}; ${UF_IFAS_TAYLOR}: 0–¼ in (⅛ in as the shallow end is from memory)`),
    daysToEmergence: s([5, 10], MEMORY),
    frostTolerance: s('hardy', MEMORY),
    fallWeeksBeforeFirstFrost: s(8, MEMORY),
    seedsPerLb: s(800_000, `${PENN_STATE_WHITE_CLOVER}: about 800,000 seeds per lb`),
    frostSeedable: true,
    frostSeedingRateLbPerAcre: s([1, 2], FROST_WHITE_CLOVER),
  },
  {
    id: 'red-clover',
    name: 'Red clover',
    kind: 'clover',
    season: 'cool',
    lifeCycle: 'perennial', // short-lived perennial (OSU ANR-0132)
    minSoilTempF: s(41, OSU_RED_CLOVER),
    optimumSoilTempF: s([55, 75], MEMORY),
    broadcastRateLbPerAcre: s([12, 15], ALABAMA_BALL),
    drilledRateLbPerAcre: s([6, 8], ALABAMA_BALL),
    seedDepthIn: s([0.25, 0.5], OSU_RED_CLOVER),
    daysToEmergence: s([5, 10], MEMORY),
    frostTolerance: s('hardy', `${OSU_RED_CLOVER}: winter survival expected`),
    fallWeeksBeforeFirstFrost: s(8, MEMORY),
    seedsPerLb: s(272_200, OSU_RED_CLOVER),
    frostSeedable: true, // OSU ANR-0132: "may also be frost-seeded"
    frostSeedingRateLbPerAcre: s([6, 8], FROST_RED_CLOVER),
  },
  {
    id: 'crimson-clover',
    name: 'Crimson clover',
    kind: 'clover',
    season: 'cool',
    lifeCycle: 'annual',
    minSoilTempF: s(42, OSU_CRIMSON),
    optimumSoilTempF: s([55, 75], MEMORY),
    broadcastRateLbPerAcre: s([22, 30], MSU_UGA_CRIMSON),
    drilledRateLbPerAcre: s([15, 18], MSU_UGA_CRIMSON),
    seedDepthIn: s([0.25, 0.5], OSU_CRIMSON),
    daysToEmergence: s([5, 10], MEMORY),
    frostTolerance: s('hardy', `${MEMORY}; OSU ANR-0129 notes great variation in winter hardiness between varieties`),
    // 6–8 weeks before the average first frost; 6 is the latest that still meets it.
    fallWeeksBeforeFirstFrost: s(6, `${MSU_UGA_CRIMSON}: sow 6–8 weeks before the average first frost`),
    seedsPerLb: s(149_700, OSU_CRIMSON),
    frostSeedable: false, // OSU ANR-0129: "does not frost-seed well"
  },
  {
    id: 'arrowleaf-clover',
    name: 'Arrowleaf clover',
    kind: 'clover',
    season: 'cool',
    lifeCycle: 'annual',
    minSoilTempF: s(40, MEMORY),
    optimumSoilTempF: s([55, 75], MEMORY),
    broadcastRateLbPerAcre: s([8, 12], `${MSU_M1591}: 12; the lower end from memory`),
    drilledRateLbPerAcre: s([5, 8], `${MSU_M1591}: 8; the lower end from memory`),
    seedDepthIn: s([0.125, 0.25], MEMORY),
    daysToEmergence: s([5, 10], MEMORY),
    frostTolerance: s('hardy', MEMORY),
    fallWeeksBeforeFirstFrost: s(8, MEMORY),
    seedsPerLb: s(400_000, MEMORY),
    frostSeedable: false,
  },
  {
    id: 'berseem-clover',
    name: 'Berseem clover',
    kind: 'clover',
    season: 'cool',
    lifeCycle: 'annual',
    minSoilTempF: s(40, MEMORY),
    optimumSoilTempF: s([55, 75], MEMORY),
    broadcastRateLbPerAcre: s([15, 20], `${MSU_M1591}: 20; the lower end from memory`),
    drilledRateLbPerAcre: s([10, 15], `${MSU_M1591}: 10; the upper end from memory`),
    seedDepthIn: s([0.25, 0.5], MEMORY),
    daysToEmergence: s([5, 10], MEMORY),
    frostTolerance: s('light', MEMORY),
    fallWeeksBeforeFirstFrost: s(8, MEMORY),
    seedsPerLb: s(200_000, MEMORY),
    frostSeedable: false,
  },
  {
    id: 'alfalfa',
    name: 'Alfalfa',
    kind: 'legume',
    season: 'cool',
    lifeCycle: 'perennial',
    minSoilTempF: s(40, `${NDSU_UMN_ALFALFA}: germination begins near 40 °F`),
    optimumSoilTempF: s([60, 77], MEMORY),
    broadcastRateLbPerAcre: s([15, 20], `${MSU_M1591}: 20; the lower end from memory`),
    drilledRateLbPerAcre: s([12, 15], `${MSU_M1591}: 15; the lower end from memory`),
    seedDepthIn: s([0.25, 0.5], MEMORY),
    daysToEmergence: s([3, 7], MEMORY),
    frostTolerance: s('hardy', MEMORY),
    fallWeeksBeforeFirstFrost: s(8, `${NDSU_UMN_ALFALFA}: about 8 weeks of growth before a killing frost`),
    seedsPerLb: s(220_000, MEMORY),
    frostSeedable: false,
  },
  {
    id: 'chicory',
    name: 'Chicory (forage type)',
    kind: 'forb',
    season: 'cool',
    lifeCycle: 'perennial',
    minSoilTempF: s(40, MEMORY),
    optimumSoilTempF: s([55, 75], MEMORY),
    broadcastRateLbPerAcre: s([4, 5], MEMORY),
    drilledRateLbPerAcre: s([3, 4], MEMORY),
    seedDepthIn: s([0.25, 0.5], PENN_STATE_CHICORY),
    daysToEmergence: s([3, 7], MEMORY),
    frostTolerance: s('hardy', MEMORY),
    fallWeeksBeforeFirstFrost: s(8, `${MEMORY}; Penn State warns late summer seedings may not establish before winter`),
    seedsPerLb: s(227_000, MEMORY),
    frostSeedable: true, // Penn State describes frost seeding chicory into existing pasture
  },
  {
    id: 'forage-rape',
    name: 'Forage rape',
    kind: 'brassica',
    season: 'cool',
    lifeCycle: 'annual',
    minSoilTempF: s(45, `${MEMORY}; taken equal to forage turnip (same genus, ${OSU_TURNIP})`),
    optimumSoilTempF: s([55, 85], MEMORY),
    broadcastRateLbPerAcre: s([10, 12], ALABAMA_BALL),
    drilledRateLbPerAcre: s([5, 8], `${MEMORY}; OSU (Penrose 2003) gives 3.5–4 lb/acre for rape`),
    seedDepthIn: s([0.25, 0.5], MEMORY),
    daysToEmergence: s([3, 7], MEMORY),
    frostTolerance: s('hardy', OSU_BRASSICA_DAYS),
    fallWeeksBeforeFirstFrost: s(8, OSU_BRASSICA_DAYS),
    seedsPerLb: s(157_000, MEMORY),
    frostSeedable: false,
  },
  {
    id: 'turnip',
    name: 'Turnip (forage type)',
    kind: 'brassica',
    season: 'cool',
    lifeCycle: 'annual',
    minSoilTempF: s(45, `${OSU_TURNIP}: minimum germination temperature 45 °F (Harrington's table gives 40 °F)`),
    optimumSoilTempF: s([60, 105], `${HARRINGTON}: turnip optimum range`),
    broadcastRateLbPerAcre: s([3, 4], `${OSU_TURNIP}: broadcast without incorporation, pure live seed`),
    drilledRateLbPerAcre: s([1.5, 2], OSU_BRASSICA_RATES),
    seedDepthIn: s([0.25, 0.5], OSU_TURNIP),
    daysToEmergence: s([1, 2], `${HARRINGTON}: days to seedlings at 68–86 °F from ½ in depth`),
    frostTolerance: s('hardy', OSU_BRASSICA_DAYS),
    fallWeeksBeforeFirstFrost: s(8, OSU_BRASSICA_DAYS),
    seedsPerLb: s(192_800, OSU_TURNIP),
    frostSeedable: false,
  },
  {
    id: 'forage-radish',
    name: 'Forage radish',
    kind: 'brassica',
    season: 'cool',
    lifeCycle: 'annual',
    minSoilTempF: s(45, `${OSU_RADISH}: minimum germination temperature 45 °F (Harrington's table gives 40 °F)`),
    optimumSoilTempF: s([45, 90], `${HARRINGTON}: radish optimum range`),
    broadcastRateLbPerAcre: s([12, 15], UGA_RADISH),
    drilledRateLbPerAcre: s([10, 12], UGA_RADISH),
    seedDepthIn: s([0.25, 0.5], OSU_RADISH),
    daysToEmergence: s([3, 4], `${HARRINGTON}: days to seedlings at 68–86 °F from ½ in depth`),
    frostTolerance: s('light', `${OSU_RADISH}: winter survival seldom; ${UGA_RADISH}: unaffected by early frost`),
    fallWeeksBeforeFirstFrost: s(6, MEMORY),
    seedsPerLb: s(34_000, OSU_RADISH),
    frostSeedable: false,
  },
  {
    id: 'cereal-rye',
    name: 'Cereal rye',
    kind: 'grain',
    season: 'cool',
    lifeCycle: 'annual',
    minSoilTempF: s(34, `${SARE}: germinates as low as 34 °F`),
    optimumSoilTempF: s([55, 70], MEMORY),
    broadcastRateLbPerAcre: s([90, 160], SARE),
    drilledRateLbPerAcre: s([60, 120], SARE),
    seedDepthIn: s([1, 2], `${UF_IFAS_TAYLOR}: rye for forage 1–2 in`),
    daysToEmergence: s([4, 7], MEMORY),
    frostTolerance: s('hardy', SARE),
    fallWeeksBeforeFirstFrost: s(2, `${COMMON}: rye still establishes when sown close to frost`),
    seedsPerLb: s(18_000, MEMORY),
    frostSeedable: false,
  },
  {
    id: 'winter-wheat',
    name: 'Winter wheat',
    kind: 'grain',
    season: 'cool',
    lifeCycle: 'annual',
    minSoilTempF: s(40, NDSU),
    optimumSoilTempF: s([45, 50], NDSU_OPTIMUM),
    broadcastRateLbPerAcre: s([90, 120], ALABAMA_BALL),
    drilledRateLbPerAcre: s([50, 80], ALABAMA_BALL),
    seedDepthIn: s([1, 2], `${UF_IFAS_TAYLOR}: wheat for forage 1–2 in`),
    daysToEmergence: s([5, 10], MEMORY),
    frostTolerance: s('hardy', MEMORY),
    fallWeeksBeforeFirstFrost: s(4, MEMORY),
    seedsPerLb: s(15_000, MEMORY),
    frostSeedable: false,
  },
  {
    id: 'oats',
    name: 'Oats',
    kind: 'grain',
    season: 'cool',
    lifeCycle: 'annual',
    minSoilTempF: s(45, NDSU),
    optimumSoilTempF: s([50, 55], NDSU_OPTIMUM),
    // The guides differ: 80–100 (Alabama, citing Ball et al.), 96–128 (UF/IFAS), 120–150 (MSU M1591) broadcast.
    broadcastRateLbPerAcre: s([80, 150], `80–100: ${ALABAMA_BALL}; 120–150: ${MSU_M1591}; ${UF_IFAS_TAYLOR}: 96–128 (3–4 bu)`),
    drilledRateLbPerAcre: s([90, 100], MSU_M1591),
    seedDepthIn: s([1, 2], UF_IFAS_TAYLOR),
    daysToEmergence: s([5, 10], MEMORY),
    frostTolerance: s('light', `${MEMORY}: oats winter-kill in hard freezes`),
    fallWeeksBeforeFirstFrost: s(6, MEMORY),
    seedsPerLb: s(14_000, MEMORY),
    frostSeedable: false,
  },
  {
    id: 'austrian-winter-peas',
    name: 'Austrian winter peas',
    kind: 'legume',
    season: 'cool',
    lifeCycle: 'annual',
    minSoilTempF: s(40, `${HARRINGTON}: pea minimum 40 °F`),
    optimumSoilTempF: s([40, 75], `${HARRINGTON}: pea optimum range`),
    broadcastRateLbPerAcre: s([50, 70], `${MSU_M1591}: 50; the upper end from memory`),
    drilledRateLbPerAcre: s([30, 50], `${MSU_M1591}: 30; the upper end from memory`),
    seedDepthIn: s([1, 2], MEMORY),
    daysToEmergence: s([6, 9], `${HARRINGTON}: pea, days to seedlings at 59–77 °F`),
    frostTolerance: s('hardy', MEMORY),
    fallWeeksBeforeFirstFrost: s(6, MEMORY),
    seedsPerLb: s(4_000, MEMORY),
    frostSeedable: false,
  },
  {
    id: 'soybeans',
    name: 'Soybeans (forage type)',
    kind: 'legume',
    season: 'warm',
    lifeCycle: 'annual',
    minSoilTempF: s(50, NDSU),
    optimumSoilTempF: s([55, 60], NDSU_OPTIMUM),
    broadcastRateLbPerAcre: s([80, 100], MEMORY),
    drilledRateLbPerAcre: s([50, 70], MEMORY),
    seedDepthIn: s([1, 1.5], MEMORY),
    daysToEmergence: s([5, 10], MEMORY),
    frostTolerance: s('tender', MEMORY),
    fallWeeksBeforeFirstFrost: s(10, MEMORY),
    seedsPerLb: s(2_800, MEMORY),
    frostSeedable: false,
  },
  {
    id: 'cowpeas',
    name: 'Cowpeas',
    kind: 'legume',
    season: 'warm',
    lifeCycle: 'annual',
    minSoilTempF: s(65, `${SARE}: plant when soil reaches 65 °F`),
    optimumSoilTempF: s([70, 85], MEMORY),
    broadcastRateLbPerAcre: s([40, 90], ALABAMA_BALL),
    drilledRateLbPerAcre: s([30, 50], MEMORY),
    seedDepthIn: s([1, 2], MEMORY),
    daysToEmergence: s([5, 10], MEMORY),
    frostTolerance: s('tender', MEMORY),
    fallWeeksBeforeFirstFrost: s(10, MEMORY),
    seedsPerLb: s(3_600, MEMORY),
    frostSeedable: false,
  },
  {
    id: 'corn',
    name: 'Corn',
    kind: 'grain',
    season: 'warm',
    lifeCycle: 'annual',
    minSoilTempF: s(50, NDSU),
    optimumSoilTempF: s([55, 60], NDSU_OPTIMUM),
    broadcastRateLbPerAcre: s([15, 20], MEMORY),
    drilledRateLbPerAcre: s([10, 15], MEMORY),
    seedDepthIn: s([1.5, 2], MEMORY),
    daysToEmergence: s([4, 7], `${HARRINGTON}: corn, days to seedlings at 68–86 °F from ½ in depth`),
    frostTolerance: s('tender', MEMORY),
    fallWeeksBeforeFirstFrost: s(16, `${MEMORY}: grain needs about 100–120 days`),
    seedsPerLb: s(1_500, MEMORY),
    frostSeedable: false,
  },
  {
    id: 'grain-sorghum',
    name: 'Grain sorghum',
    kind: 'grain',
    season: 'warm',
    lifeCycle: 'annual',
    minSoilTempF: s(60, MEMORY),
    optimumSoilTempF: s([65, 85], MEMORY),
    broadcastRateLbPerAcre: s([15, 20], MEMORY),
    drilledRateLbPerAcre: s([8, 12], MEMORY),
    seedDepthIn: s([1, 1.5], MEMORY),
    daysToEmergence: s([5, 10], MEMORY),
    frostTolerance: s('tender', MEMORY),
    fallWeeksBeforeFirstFrost: s(14, MEMORY),
    seedsPerLb: s(15_000, MEMORY),
    frostSeedable: false,
  },
  {
    id: 'buckwheat',
    name: 'Buckwheat',
    kind: 'forb',
    season: 'warm',
    lifeCycle: 'annual',
    minSoilTempF: s(65, CORNELL_BUCKWHEAT),
    optimumSoilTempF: s([70, 85], MEMORY),
    broadcastRateLbPerAcre: s([60, 75], MEMORY),
    drilledRateLbPerAcre: s([50, 60], MEMORY),
    seedDepthIn: s([0.5, 1.5], MEMORY),
    daysToEmergence: s([3, 5], MEMORY),
    frostTolerance: s('tender', MEMORY),
    fallWeeksBeforeFirstFrost: s(6, CORNELL_BUCKWHEAT_WEEKS),
    seedsPerLb: s(15_000, MEMORY),
    frostSeedable: false,
  },
];

export const SPECIES: readonly Species[] = Object.freeze(CATALOG.map(withStand));

const BY_ID = new Map(SPECIES.map((species) => [species.id, species]));

export function getSpecies(id: string): Species {
  const species = BY_ID.get(id);
  if (!species) {
    throw new Error(`Unknown species "${id}". Known species: ${SPECIES.map((x) => x.id).join(', ')}.`);
  }
  return species;
}

/** share: the fraction of the species' pure-stand rate sown in the blend (0 < share ≤ 1). */
export interface BlendPart {
  speciesId: string;
  share: number;
}

export interface BlendProfile {
  parts: BlendPart[];
  /** Σ share × midpoint of each species' broadcast range. */
  broadcastRateLbPerAcre: number;
  drilledRateLbPerAcre: number;
  /** The most demanding species (highest minimum). */
  minSoilTempF: number;
  /** [max of lows, min of highs]; when that band is empty, [max low, max low]. */
  optimumSoilTempF: [number, number];
  limitingSpeciesId: string;
  /** The slowest species' range (latest low, latest high). */
  daysToEmergence: [number, number];
  fallWeeksBeforeFirstFrost: number;
  frostTender: boolean;
  season: SeasonKind | 'mixed';
  expectedStandPlantsPerSqFt: [number, number];
}

const midpoint = ([low, high]: [number, number]) => (low + high) / 2;

export function blendProfile(parts: BlendPart[]): BlendProfile {
  if (!Array.isArray(parts) || parts.length === 0) {
    throw new Error('A blend needs at least one species.');
  }
  const seen = new Set<string>();
  const members = parts.map((part) => {
    const species = getSpecies(part.speciesId);
    if (seen.has(species.id)) {
      throw new Error(`${species.name} is listed twice in the blend; give it once with its combined share.`);
    }
    seen.add(species.id);
    if (typeof part.share !== 'number' || !Number.isFinite(part.share) || part.share <= 0 || part.share > 1) {
      throw new Error(
        `The share of ${species.name} must be more than 0 and at most 1 (a fraction of its pure-stand rate); got ${part.share}.`,
      );
    }
    return { species, share: part.share };
  });

  let limiting = members[0].species;
  for (const { species } of members) {
    if (species.minSoilTempF.value > limiting.minSoilTempF.value) limiting = species;
  }
  const optimumLow = Math.max(...members.map(({ species }) => species.optimumSoilTempF.value[0]));
  const optimumHigh = Math.min(...members.map(({ species }) => species.optimumSoilTempF.value[1]));
  const seasons = new Set(members.map(({ species }) => species.season));

  const sum = (f: (m: (typeof members)[number]) => number) => members.reduce((total, m) => total + f(m), 0);
  return {
    parts: members.map(({ species, share }) => ({ speciesId: species.id, share })),
    broadcastRateLbPerAcre: sum(({ species, share }) => share * midpoint(species.broadcastRateLbPerAcre.value)),
    drilledRateLbPerAcre: sum(({ species, share }) => share * midpoint(species.drilledRateLbPerAcre.value)),
    minSoilTempF: limiting.minSoilTempF.value,
    optimumSoilTempF: optimumLow <= optimumHigh ? [optimumLow, optimumHigh] : [optimumLow, optimumLow],
    limitingSpeciesId: limiting.id,
    daysToEmergence: [
      Math.max(...members.map(({ species }) => species.daysToEmergence.value[0])),
      Math.max(...members.map(({ species }) => species.daysToEmergence.value[1])),
    ],
    fallWeeksBeforeFirstFrost: Math.max(...members.map(({ species }) => species.fallWeeksBeforeFirstFrost.value)),
    frostTender: members.some(({ species }) => species.frostTolerance.value === 'tender'),
    season: seasons.size === 1 ? [...seasons][0] : 'mixed',
    expectedStandPlantsPerSqFt: [
      sum(({ species, share }) => share * species.expectedStandPlantsPerSqFt.value[0]),
      sum(({ species, share }) => share * species.expectedStandPlantsPerSqFt.value[1]),
    ],
  };
}
