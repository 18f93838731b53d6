// Moist-air relations used for spray timing (Delta T) and reference evapotranspiration.
// Sources: FAO Irrigation and Drainage Paper 56 (Allen, Pereira, Raes & Smith 1998), chapter 3, eqs. 7–19;
// Alduchov & Eskridge (1996), J. Appl. Meteor. 35, 601–609 (Magnus constants for the dew point);
// Stull (2011), J. Appl. Meteor. Climatol. 50, 2267–2269 (wet bulb from T and RH).
// Temperatures in °C, pressures in kPa, relative humidity in percent.

// Coldest and hottest screen-level air temperatures on record (about −89 °C and 57 °C), with a margin:
// anything outside is a unit mix-up or a broken feed, not weather.
const AIR_TEMP_MIN_C = -90;
const AIR_TEMP_MAX_C = 60;

export function assertAirTempC(tempC: number, name = 'Air temperature'): void {
  if (!Number.isFinite(tempC)) throw new RangeError(`${name} must be a number of °C, got ${tempC}.`);
  if (tempC < AIR_TEMP_MIN_C || tempC > AIR_TEMP_MAX_C) {
    throw new RangeError(
      `${name} of ${tempC} °C is outside ${AIR_TEMP_MIN_C}…${AIR_TEMP_MAX_C} °C — is it in °F or kelvin?`,
    );
  }
}

export function assertRelativeHumidityPct(rhPct: number, name = 'Relative humidity'): void {
  if (!Number.isFinite(rhPct)) throw new RangeError(`${name} must be a number of percent, got ${rhPct}.`);
  if (rhPct < 0 || rhPct > 100) throw new RangeError(`${name} must be between 0 and 100 %, got ${rhPct} %.`);
}

/** e°(T), saturation vapour pressure over water, kPa — FAO-56 eq. 11. */
export function saturationVapourPressureKPa(tempC: number): number {
  assertAirTempC(tempC);
  return 0.6108 * Math.exp((17.27 * tempC) / (tempC + 237.3));
}

/** es, mean saturation vapour pressure of a day from its extremes, kPa — FAO-56 eq. 12. Averaging e°(Tmax)
 *  and e°(Tmin) rather than taking e°(Tmean) matters because e° is convex in T. */
export function meanSaturationVapourPressureKPa(tMaxC: number, tMinC: number): number {
  assertMaxNotBelowMin(tMaxC, tMinC);
  return (saturationVapourPressureKPa(tMaxC) + saturationVapourPressureKPa(tMinC)) / 2;
}

/** Δ, slope of the saturation vapour pressure curve at T, kPa/°C — FAO-56 eq. 13. */
export function saturationVapourPressureSlopeKPaPerC(tempC: number): number {
  return (4098 * saturationVapourPressureKPa(tempC)) / (tempC + 237.3) ** 2;
}

/** P, mean atmospheric pressure at an elevation, kPa — FAO-56 eq. 7 (standard atmosphere, 20 °C). */
export function atmosphericPressureKPa(elevationM: number): number {
  // Dead Sea shore to well above any farmland; the eq. 7 power law is meant for the lower troposphere.
  if (!Number.isFinite(elevationM) || elevationM < -500 || elevationM > 9000) {
    throw new RangeError(`Elevation must be between −500 and 9,000 m, got ${elevationM} m.`);
  }
  return 101.3 * ((293 - 0.0065 * elevationM) / 293) ** 5.26;
}

/** γ, psychrometric constant, kPa/°C — FAO-56 eq. 8 (cp 1.013e-3 MJ kg⁻¹ °C⁻¹, ε 0.622, λ 2.45 MJ/kg). */
export function psychrometricConstantKPaPerC(pressureKPa: number): number {
  if (!Number.isFinite(pressureKPa) || pressureKPa <= 0) {
    throw new RangeError(`Atmospheric pressure must be a positive number of kPa, got ${pressureKPa}.`);
  }
  return 0.665e-3 * pressureKPa;
}

/** ea from the dew point, kPa — FAO-56 eq. 14 (with eq. 48, Tdew ≈ Tmin, when no humidity is measured). */
export function actualVapourPressureFromDewPointKPa(dewPointC: number): number {
  return saturationVapourPressureKPa(dewPointC);
}

/** ea from the day's RHmax and RHmin, kPa — FAO-56 eq. 17. RHmax pairs with Tmin and RHmin with Tmax
 *  because they occur at about the same hours. (The paper prints eq. 17 once without the "/2"; it belongs.) */
export function actualVapourPressureFromRhMaxMinKPa(tMaxC: number, tMinC: number, rhMaxPct: number, rhMinPct: number): number {
  assertMaxNotBelowMin(tMaxC, tMinC);
  assertRelativeHumidityPct(rhMaxPct, 'Maximum relative humidity');
  assertRelativeHumidityPct(rhMinPct, 'Minimum relative humidity');
  if (rhMinPct > rhMaxPct) {
    throw new RangeError(`Minimum relative humidity (${rhMinPct} %) is above the maximum (${rhMaxPct} %).`);
  }
  return (saturationVapourPressureKPa(tMinC) * (rhMaxPct / 100) + saturationVapourPressureKPa(tMaxC) * (rhMinPct / 100)) / 2;
}

/** ea from RHmax alone, kPa — FAO-56 eq. 18, for when RHmin is missing or doubtful. */
export function actualVapourPressureFromRhMaxKPa(tMinC: number, rhMaxPct: number): number {
  assertRelativeHumidityPct(rhMaxPct, 'Maximum relative humidity');
  return saturationVapourPressureKPa(tMinC) * (rhMaxPct / 100);
}

/** ea from the day's mean RH, kPa — FAO-56 eq. 19, the least preferred of the humidity routes. */
export function actualVapourPressureFromRhMeanKPa(tMaxC: number, tMinC: number, rhMeanPct: number): number {
  assertMaxNotBelowMin(tMaxC, tMinC);
  assertRelativeHumidityPct(rhMeanPct, 'Mean relative humidity');
  return (rhMeanPct / 100) * ((saturationVapourPressureKPa(tMaxC) + saturationVapourPressureKPa(tMinC)) / 2);
}

// Alduchov & Eskridge (1996) Magnus constants (their "AERK" fit, es = 610.94 Pa · exp(17.625 T / (T + 243.04))):
// the best of the simple forms over −40…50 °C, which is why dew point uses them rather than FAO-56's eq. 11.
const MAGNUS_A = 17.625;
const MAGNUS_B_C = 243.04;

/** Dew point over water, °C: the temperature at which the air's vapour pressure saturates it, found by
 *  inverting the Magnus form es = 0.61094 · exp(a T / (T + b)) of Alduchov & Eskridge (1996). */
export function dewPointC(tempC: number, rhPct: number): number {
  assertAirTempC(tempC);
  assertRelativeHumidityPct(rhPct);
  if (rhPct === 0) throw new RangeError('Dew point is undefined for perfectly dry air (0 % relative humidity).');
  const gamma = Math.log(rhPct / 100) + (MAGNUS_A * tempC) / (MAGNUS_B_C + tempC);
  return (MAGNUS_B_C * gamma) / (MAGNUS_A - gamma);
}

// Stull (2011) fitted his formula for RH 5–99 % and T −20…50 °C at sea-level pressure; inside that range it is
// within −1…+0.65 °C of a full psychrometric solution. Outside it the fit diverges (it can return a wet bulb
// above the dry bulb), so there we solve the psychrometric equation itself.
const STULL_RH_MIN_PCT = 5;
const STULL_RH_MAX_PCT = 99;
const STULL_TEMP_MIN_C = -20;
const STULL_TEMP_MAX_C = 50;

function stullWetBulbC(tempC: number, rhPct: number): number {
  return (
    tempC * Math.atan(0.151977 * Math.sqrt(rhPct + 8.313659)) +
    Math.atan(tempC + rhPct) -
    Math.atan(rhPct - 1.676331) +
    0.00391838 * rhPct ** 1.5 * Math.atan(0.023101 * rhPct) -
    4.686035
  );
}

// FAO-56 eq. 15–16: ea = e°(Twet) − γpsy (Tdry − Twet), with apsy = 0.000662 °C⁻¹ for a ventilated
// (Assmann-type) psychrometer, at standard sea-level pressure 101.325 kPa as Stull assumes.
const VENTILATED_PSYCHROMETER_COEFFICIENT_PER_C = 0.000662;
const STANDARD_PRESSURE_KPA = 101.325;

function psychrometricWetBulbC(tempC: number, rhPct: number): number {
  const vapourKPa = (rhPct / 100) * saturationVapourPressureKPa(tempC);
  const gammaPsy = VENTILATED_PSYCHROMETER_COEFFICIENT_PER_C * STANDARD_PRESSURE_KPA;
  // The residual rises monotonically in Twet; the wet bulb lies between an extreme low and the dry bulb.
  let low = AIR_TEMP_MIN_C;
  let high = tempC;
  for (let i = 0; i < 80; i += 1) {
    const mid = (low + high) / 2;
    const residual = saturationVapourPressureKPa(mid) - gammaPsy * (tempC - mid) - vapourKPa;
    if (residual > 0) high = mid;
    else low = mid;
  }
  return (low + high) / 2;
}

/** Wet-bulb temperature, °C, from air temperature and RH — Stull (2011) inside its fitted range, the
 *  psychrometric equation (FAO-56 eq. 15–16) outside it. Never above the dry bulb. */
export function wetBulbC(tempC: number, rhPct: number): number {
  assertAirTempC(tempC);
  assertRelativeHumidityPct(rhPct);
  if (rhPct === 100) return tempC;
  const inStullRange =
    rhPct >= STULL_RH_MIN_PCT &&
    rhPct <= STULL_RH_MAX_PCT &&
    tempC >= STULL_TEMP_MIN_C &&
    tempC <= STULL_TEMP_MAX_C;
  const wetC = inStullRange ? stullWetBulbC(tempC, rhPct) : psychrometricWetBulbC(tempC, rhPct);
  // Saturated air cannot cool by evaporation; the fit's small positive error near 99 % would say it can.
  return Math.min(wetC, tempC);
}

/** Delta T, °C: dry bulb minus wet bulb, the spray-drift and droplet-evaporation index used in spray
 *  application guidance (about 2–8 °C preferred). */
export function deltaTC(tempC: number, rhPct: number): number {
  return tempC - wetBulbC(tempC, rhPct);
}

function assertMaxNotBelowMin(tMaxC: number, tMinC: number): void {
  assertAirTempC(tMaxC, 'Maximum temperature');
  assertAirTempC(tMinC, 'Minimum temperature');
  if (tMinC > tMaxC) {
    throw new RangeError(`Minimum temperature (${tMinC} °C) is above the maximum (${tMaxC} °C).`);
  }
}
