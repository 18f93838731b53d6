// Steps that can hurt someone carry the usual cautions in plain words, and Sowcast defers to the label, local
// codes and licensed practice. The wording checked is the standard one: "the label is the law" (US EPA
// pesticide labeling guidance), chainsaw PPE (chaps, helmet, eye and ear protection — OSHA/forestry practice),
// burn permits, fire breaks and bans (state forestry burn rules). Common practice, no single source.
import { describe, expect, it } from 'vitest';
import { DEFER } from '@/lib/schedule/cautions';
import { planPlanting } from '@/lib/schedule/plan';
import { localNoon } from './forecast-fixture';
import { planting, step } from './plantings';

const input = planting({
  cover: 'brush',
  clearBrush: true,
  burn: { planned: true, permitInHand: true },
  targetSeedDate: '2027-10-01',
  herbicide: { productName: 'Example burndown', rate: { percentSolution: 2 } },
  sprayer: { tankGal: 4, carrierGalPerAcre: 15 },
  fertilizer: { grade: [13, 13, 13], target: { n: 20 } },
});
const plan = planPlanting(input, null, localNoon('2027-08-01'));
const text = (key: string) => step(plan, key).cautions.map((c) => c.text).join(' ');

describe('cautions', () => {
  it('puts the herbicide label first on spraying: rates, PPE, re-entry, rainfast, water and drift', () => {
    const spray = text('spray');
    expect(step(plan, 'spray').cautions.every((c) => c.topic === 'herbicide')).toBe(true);
    for (const words of ['label is the law', 'rates', 'protective equipment', 're-entry', 'rainfast', 'water', 'drift']) expect(spray).toContain(words);
    expect(spray).toContain(DEFER);
  });

  it('asks for the burn permit, a fire break, and a check of bans and local burn rules', () => {
    const burn = text('burn');
    for (const words of ['permit', 'fire break', 'banned', 'check local burn rules']) expect(burn).toContain(words);
    expect(step(plan, 'burn').rules.some((r) => r.reason.includes('check local burn rules'))).toBe(true);
    expect(burn).toContain(DEFER);
  });

  it('lists chainsaw protective equipment on clearing brush', () => {
    const clear = text('clear-brush');
    for (const words of ['chaps', 'helmet', 'eye and ear protection']) expect(clear).toContain(words);
    expect(clear).toContain(DEFER);
  });

  it('says Sowcast defers to the label, local codes and licensed practice', () => {
    expect(DEFER).toContain('defers to the product label, local codes and licensed practice');
  });

  it('leaves the burn out, with a warning, when no permit is recorded', () => {
    const noPermit = planPlanting({ ...input, burn: { planned: true, permitInHand: false } }, null, localNoon('2027-08-01'));
    expect(noPermit.steps.map((s) => s.key)).not.toContain('burn');
    expect(noPermit.warnings.join(' ')).toContain('no burn permit or approval is recorded');
    expect(noPermit.warnings.join(' ')).toContain('check local burn rules');
  });
});
