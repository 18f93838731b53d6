// Numbers as a person reads them in a reason or on a list of things to carry. US customary units, because the
// people planting read bags, gauges and labels in pounds, inches, gallons, mph and °F.
import { cToF, mmToIn } from '@/lib/agronomy/units';

const formatters = new Map<number, Intl.NumberFormat>();

/** 1234.5 → '1,234.5'; at most `maxFraction` decimals, trailing zeros dropped. */
export function formatNumber(value: number, maxFraction = 1): string {
  let f = formatters.get(maxFraction);
  if (!f) {
    f = new Intl.NumberFormat('en-US', { maximumFractionDigits: maxFraction, minimumFractionDigits: 0 });
    formatters.set(maxFraction, f);
  }
  return f.format(value);
}

/** Precision that suits the size: 0.25 → '0.25', 7.5 → '7.5', 153.8 → '154'. */
export function formatAmount(value: number): string {
  const abs = Math.abs(value);
  return formatNumber(value, abs >= 100 ? 0 : abs >= 10 ? 1 : 2);
}

export function inchesOfRain(mm: number): string {
  const inches = mmToIn(mm);
  return `${formatNumber(inches, inches < 0.1 ? 2 : 1)} in`;
}

/** A threshold, to the hundredth: 6.35 mm → '0.25 in'. */
export function inchesPrecise(mm: number): string {
  return `${formatNumber(mmToIn(mm), 2)} in`;
}

export function degreesF(tempC: number): string {
  return `${Math.round(cToF(tempC))} °F`;
}

/** A range 'a–b' that collapses to 'a' when both round alike. */
export function span(lo: string, hi: string): string {
  return lo === hi ? lo : `${lo}–${hi}`;
}
