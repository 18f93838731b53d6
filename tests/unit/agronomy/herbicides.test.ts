// The herbicide actives catalog against the published plant-back and label sources it cites. Each check
// names its source; values the catalog marks "from memory" are not asserted as published facts here.
import { describe, expect, it } from 'vitest';
import {
  activesHarmingStand,
  blendCropGroups,
  cropGroupOf,
  getHerbicideActive,
  HERBICIDE_ACTIVE_IDS,
  LABEL_IS_THE_LAW,
  longestPlantBack,
  mixKillWait,
  mixRainfastHours,
} from '@/lib/agronomy/herbicides';
import { getSpecies } from '@/lib/agronomy/species';

describe('herbicide actives catalog', () => {
  it('holds the actives the issue names, each value with a source and the label-is-the-law note', () => {
    for (const id of ['glyphosate', '2,4-d-ester', '2,4-d-amine', 'dicamba', 'triclopyr', 'clethodim', 'sethoxydim', 'imazethapyr', 'paraquat', 'glufosinate']) {
      expect(HERBICIDE_ACTIVE_IDS).toContain(id);
      const a = getHerbicideActive(id);
      expect(a.rainfastSource.length).toBeGreaterThan(10);
      expect(a.killWaitSource.length).toBeGreaterThan(10);
      for (const pb of Object.values(a.plantBack)) expect(pb.source.length).toBeGreaterThan(10);
    }
    expect(LABEL_IS_THE_LAW).toMatch(/label on your jug is the law/);
    expect(() => getHerbicideActive('atrazine')).toThrow(/Unknown herbicide active "atrazine"/);
  });

  it('2,4-D ester: 30 days before clovers and brassicas, 29 before small grains and sorghum, 14 before corn (Penn State Extension, "Including 2,4-D in the Burndown")', () => {
    const a = getHerbicideActive('2,4-d-ester');
    expect(a.plantBack.legumes.days).toBe(30);
    expect(a.plantBack.brassicas.days).toBe(30);
    expect(a.plantBack['small-grains'].days).toBe(29);
    expect(a.plantBack.sorghum.days).toBe(29);
    expect(a.plantBack.corn.days).toBe(14); // the long end of the label table's 7–14
    expect(a.plantBack.legumes.source).toMatch(/Penn State/);
    // Iowa State / Illinois IPM: up to 1 pint/acre of a 4 lb/gal ester at least 7 days before soybeans.
    expect(a.plantBack.soybeans.days).toBe(7);
    // Illinois IPM Bulletin (2012): some ester labels allow no tillage for 7 days after application.
    expect(a.killWaitDays).toBe(7);
    expect(a.controls).toEqual(['broadleaf', 'woody']);
  });

  it('dicamba: corn any time, soybeans 28 days after 16 fl oz, sorghum 15 (Mississippi State Extension, "Auxin Herbicide Plantback Restrictions", quoting the Clarity label)', () => {
    const a = getHerbicideActive('dicamba');
    expect(a.plantBack.corn.days).toBe(0);
    expect(a.plantBack.soybeans.days).toBe(28);
    expect(a.plantBack.sorghum.days).toBe(15);
    // Clarity label (Greenbook): do not cultivate within 7 days after applying.
    expect(a.killWaitDays).toBe(7);
  });

  it('glyphosate and paraquat have no soil activity, so no plant-back for any crop (glyphosate label; UNL CropWatch)', () => {
    for (const id of ['glyphosate', 'paraquat']) {
      const a = getHerbicideActive(id);
      expect(a.soilActive).toBe(false);
      expect(Object.values(a.plantBack).every((pb) => pb.days === 0)).toBe(true);
    }
    expect(longestPlantBack(['glyphosate'], ['legumes', 'brassicas', 'small-grains', 'corn', 'soybeans'])).toBeNull();
  });

  it('clethodim: rainfast in 1 hour; crops not on the label 30 days after (Select 2 EC label)', () => {
    const a = getHerbicideActive('clethodim');
    expect(a.rainfastHours).toBe(1);
    expect(a.plantBack['small-grains'].days).toBe(30);
    expect(a.plantBack.corn.days).toBe(30);
    expect(a.controls).toEqual(['grass']);
  });

  it('imazethapyr: 18 months before oats and sorghum (Pacific Northwest Weed Management Handbook)', () => {
    const a = getHerbicideActive('imazethapyr');
    expect(a.plantBack['small-grains'].days).toBe(540);
    expect(a.plantBack.sorghum.days).toBe(540);
    expect(a.plantBack.legumes.days).toBe(0); // labeled on alfalfa and clover (same handbook)
  });

  it('maps the species catalog to plant-back crop groups by kind, with corn, sorghum and soybeans by id', () => {
    expect(cropGroupOf(getSpecies('white-clover'))).toBe('legumes');
    expect(cropGroupOf(getSpecies('austrian-winter-peas'))).toBe('legumes');
    expect(cropGroupOf(getSpecies('soybeans'))).toBe('soybeans');
    expect(cropGroupOf(getSpecies('turnip'))).toBe('brassicas');
    expect(cropGroupOf(getSpecies('cereal-rye'))).toBe('small-grains');
    expect(cropGroupOf(getSpecies('corn'))).toBe('corn');
    expect(cropGroupOf(getSpecies('grain-sorghum'))).toBe('sorghum');
    expect(cropGroupOf(getSpecies('chicory'))).toBe('other');
  });

  it('takes the longest plant-back of a mix over the blend, and the longest kill wait and rainfast', () => {
    // Glyphosate + 2,4-D ester before clover and cereal rye: 2,4-D ester's 30 days for legumes (Penn State).
    const groups = blendCropGroups([
      { speciesId: 'white-clover', share: 0.5 },
      { speciesId: 'cereal-rye', share: 0.5 },
    ]);
    const pb = longestPlantBack(['glyphosate', '2,4-d-ester'], groups);
    expect(pb).toMatchObject({ days: 30, group: 'legumes' });
    expect(pb?.active.id).toBe('2,4-d-ester');
    // Before soybeans alone the same mix needs only the 7 days (Iowa State).
    expect(longestPlantBack(['glyphosate', '2,4-d-ester'], ['soybeans'])?.days).toBe(7);
    expect(mixKillWait(['glyphosate', '2,4-d-ester'])?.days).toBe(7);
    // Glyphosate's 6 h (generic label) outlasts the ester's hour.
    expect(mixRainfastHours(['2,4-d-ester', 'glyphosate'])).toMatchObject({ hours: 6 });
    expect(mixRainfastHours(['clethodim'])?.hours).toBe(1);
  });

  it('knows which actives an established stand survives: grass herbicides spare clover, auxins do not', () => {
    expect(activesHarmingStand(['clethodim'], ['legumes'])).toEqual([]);
    expect(activesHarmingStand(['sethoxydim'], ['legumes', 'brassicas'])).toEqual([]);
    const hurt = activesHarmingStand(['2,4-d-ester', 'clethodim'], ['legumes']);
    expect(hurt.map((h) => h.active.id)).toEqual(['2,4-d-ester']);
    expect(activesHarmingStand(['dicamba', 'triclopyr'], ['legumes']).length).toBe(2);
    // Clethodim kills grass: it cannot go over a rye stand (Select 2 EC label: grass crops are highly sensitive).
    expect(activesHarmingStand(['clethodim'], ['small-grains']).length).toBe(1);
  });
});
