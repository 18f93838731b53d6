// Growing days before a killing freeze, per species, against the publications each value names. Freeze words are
// the National Weather Service's (first frost/freeze/hard freeze dates pages of the Jackson MS and Tallahassee
// offices, NCDC 1981–2010 normals: frost counted at 36 °F, freeze at 32 °F, hard freeze at 28 °F).
import { describe, expect, it } from 'vitest';
import {
  FREEZE_THRESHOLDS_F,
  FREEZE_THRESHOLD_SOURCES,
  GROWING_DAYS_BEFORE_KILLING_FREEZE,
  blendFreezeNeeds,
  growingDaysNeed,
} from '@/lib/agronomy/growing-days';
import { SPECIES } from '@/lib/agronomy/species';

describe('growing days before a killing freeze', () => {
  it('has a sourced entry for every catalog species, and none for species the catalog does not hold', () => {
    for (const species of SPECIES) {
      const entry = GROWING_DAYS_BEFORE_KILLING_FREEZE[species.id];
      expect(entry, species.id).toBeDefined();
      expect(Number.isInteger(entry.growingDays.value) && entry.growingDays.value > 0, species.id).toBe(true);
      // A publication, "from memory" or "common practice" — never an empty or token source.
      expect(entry.growingDays.source.length, species.id).toBeGreaterThan(20);
      expect(entry.killedBy.source.length, species.id).toBeGreaterThan(20);
      expect(entry.growingDays.source, species.id).toMatch(/Extension|University|Cornell|from memory|common practice/);
    }
    expect(Object.keys(GROWING_DAYS_BEFORE_KILLING_FREEZE).sort()).toEqual(SPECIES.map((s) => s.id).sort());
    expect(() => growingDaysNeed('kudzu')).toThrow(/No growing days .* "kudzu"/);
  });

  it('counts frost-tender species to the first 32 °F freeze and hardy ones to a hard freeze (catalog frost tolerance)', () => {
    for (const species of SPECIES) {
      const killedBy = growingDaysNeed(species.id).killedBy.value;
      expect(killedBy, species.id).toBe(species.frostTolerance.value === 'tender' ? 'freeze' : 'hard-freeze');
    }
  });

  it('uses the National Weather Service thresholds: frost 36 °F, freeze 32 °F, hard freeze 28 °F', () => {
    expect(FREEZE_THRESHOLDS_F).toEqual({ frost: 36, freeze: 32, hardFreeze: 28 });
    for (const source of Object.values(FREEZE_THRESHOLD_SOURCES)) expect(source).toMatch(/National Weather Service/);
  });

  it('alfalfa: about 8 weeks of growth before a killing frost (NDSU / University of Minnesota Extension)', () => {
    expect(growingDaysNeed('alfalfa').growingDays.value).toBe(8 * 7);
    expect(growingDaysNeed('alfalfa').growingDays.source).toMatch(/NDSU.*Minnesota/);
  });

  it('crimson clover: inside 6–8 weeks before frost (Michigan State University Extension / University of Georgia)', () => {
    const days = growingDaysNeed('crimson-clover').growingDays;
    expect(days.value).toBeGreaterThanOrEqual(6 * 7);
    expect(days.value).toBeLessThanOrEqual(8 * 7);
    expect(days.source).toMatch(/Michigan State/);
  });

  it('brassicas: about 60 days to top quality, tops hardy to 15–20 °F (Ohio State University Extension, Penrose 2003)', () => {
    for (const id of ['turnip', 'forage-rape']) {
      expect(growingDaysNeed(id).growingDays.value, id).toBe(60);
      expect(growingDaysNeed(id).killedBy.value, id).toBe('hard-freeze');
      expect(growingDaysNeed(id).growingDays.source, id).toMatch(/Penrose/);
    }
  });

  it('buckwheat: 35–40 days in the ground as a cover crop, rounded up to 6 weeks (Cornell, Björkman); killed by the first freeze', () => {
    expect(growingDaysNeed('buckwheat').growingDays.value).toBe(42);
    expect(growingDaysNeed('buckwheat').killedBy.value).toBe('freeze');
  });

  it('names each species of a blend in running text with the verb that fits', () => {
    expect(blendFreezeNeeds([{ speciesId: 'soybeans' }, { speciesId: 'turnip' }])).toEqual([
      { speciesId: 'soybeans', name: 'soybeans', needs: 'need', growingDays: 70, killedBy: 'freeze' },
      { speciesId: 'turnip', name: 'turnip', needs: 'needs', growingDays: 60, killedBy: 'hard-freeze' },
    ]);
  });
});
