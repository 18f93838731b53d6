// Reference evapotranspiration (grass reference surface), mm/day — FAO Irrigation and Drainage Paper 56,
// Allen, Pereira, Raes & Smith (1998), chapter 3. Equation numbers below are the paper's.
// Radiation in MJ m⁻² day⁻¹, temperatures in °C, wind in m/s, pressures in kPa.
import {
  actualVapourPressureFromDewPointKPa,
  actualVapourPressureFromRhMaxKPa,
  actualVapourPressureFromRhMaxMinKPa,
  actualVapourPressureFromRhMeanKPa,
  assertAirTempC,
  assertRelativeHumidityPct,
  atmosphericPressureKPa,
  meanSaturationVapourPressureKPa,
  psychrometricConstantKPaPerC,
  saturationVapourPressureSlopeKPaPerC,
} from './psychrometrics';

export interface DailyWeather {
  tMaxC: number; tMinC: number;
  rhMaxPct?: number; rhMinPct?: number; rhMeanPct?: number; dewPointC?: number; // humidity: the best one given (FAO-56 eq. 17, 19, 14/48)
  windSpeedMs: number; windHeightM?: number;            // default 2 m
  solarRadiationMJ?: number; sunshineHours?: number;    // Rs, or n (Ångström, eq. 35); else Hargreaves radiation (eq. 50)
  latitudeDeg: number; elevationM: number; dayOfYear: number;
}

/** Settings the paper leaves to the user. Defaults are FAO-56's for daily steps at an inland site. */
export interface Et0Options {
  /** G, soil heat flux, MJ m⁻² d⁻¹. FAO-56 eq. 42 takes G ≈ 0 for day and ten-day steps; monthly steps use
   *  eq. 43/44 (e.g. 0.14 (T month i − T month i−1)). */
  soilHeatFluxMJ?: number;
  /** kRs of Hargreaves' radiation formula (eq. 50): 0.16 interior, 0.19 coastal (FAO-56 p. 60). */
  hargreavesKRs?: number;
}

export const SOLAR_CONSTANT_MJ_PER_M2_MIN = 0.082; // Gsc, FAO-56 eq. 21
export const STEFAN_BOLTZMANN_MJ_PER_K4_M2_DAY = 4.903e-9; // σ, FAO-56 eq. 39
export const GRASS_REFERENCE_ALBEDO = 0.23; // α of the hypothetical grass reference, FAO-56 eq. 38
export const ANGSTROM_AS = 0.25; // FAO-56 eq. 35, where no calibrated values exist
export const ANGSTROM_BS = 0.5;
export const HARGREAVES_KRS_INTERIOR = 0.16; // FAO-56 eq. 50: land masses where air is not dominated by a large water body
export const HARGREAVES_KRS_COASTAL = 0.19; // FAO-56 eq. 50: on or next to a coast
export const MJ_TO_MM_WATER = 0.408; // 1 / λ (2.45 MJ/kg): MJ m⁻² d⁻¹ of energy → mm/day of water evaporated

function assertLatitudeDeg(latitudeDeg: number): void {
  if (!Number.isFinite(latitudeDeg) || latitudeDeg < -90 || latitudeDeg > 90) {
    throw new RangeError(`Latitude must be between −90° and 90°, got ${latitudeDeg}.`);
  }
}

function assertDayOfYear(dayOfYear: number): void {
  if (!Number.isInteger(dayOfYear) || dayOfYear < 1 || dayOfYear > 366) {
    throw new RangeError(`Day of year must be a whole number from 1 to 366, got ${dayOfYear}.`);
  }
}

interface SolarGeometry { inverseDistance: number; declinationRad: number; sunsetHourAngleRad: number; latitudeRad: number }

function solarGeometry(latitudeDeg: number, dayOfYear: number): SolarGeometry {
  assertLatitudeDeg(latitudeDeg);
  assertDayOfYear(dayOfYear);
  const latitudeRad = (Math.PI / 180) * latitudeDeg; // eq. 22
  const yearAngle = ((2 * Math.PI) / 365) * dayOfYear;
  const inverseDistance = 1 + 0.033 * Math.cos(yearAngle); // dr, eq. 23
  const declinationRad = 0.409 * Math.sin(yearAngle - 1.39); // δ, eq. 24
  // eq. 25 has no solution inside the polar circles in midsummer or midwinter; the argument is clamped so the
  // sun never sets (ωs = π) or never rises (ωs = 0), as the paper's note on high latitudes intends.
  const cosSunset = Math.min(1, Math.max(-1, -Math.tan(latitudeRad) * Math.tan(declinationRad)));
  return { inverseDistance, declinationRad, sunsetHourAngleRad: Math.acos(cosSunset), latitudeRad };
}

/** Ra, extraterrestrial radiation, MJ m⁻² d⁻¹ — FAO-56 eq. 21 with eqs. 22–25. */
export function extraterrestrialRadiation(latitudeDeg: number, dayOfYear: number): number {
  const { inverseDistance, declinationRad, sunsetHourAngleRad: ws, latitudeRad } = solarGeometry(latitudeDeg, dayOfYear);
  const ra =
    ((24 * 60) / Math.PI) *
    SOLAR_CONSTANT_MJ_PER_M2_MIN *
    inverseDistance *
    (ws * Math.sin(latitudeRad) * Math.sin(declinationRad) +
      Math.cos(latitudeRad) * Math.cos(declinationRad) * Math.sin(ws));
  // At the poles the bracket can come out a hair below zero from rounding.
  return Math.max(0, ra);
}

/** N, maximum possible sunshine duration (daylight hours) — FAO-56 eq. 34. */
export function daylightHours(latitudeDeg: number, dayOfYear: number): number {
  return (24 / Math.PI) * solarGeometry(latitudeDeg, dayOfYear).sunsetHourAngleRad;
}

/** u2, wind speed at 2 m above grass from a reading at another height, m/s — FAO-56 eq. 47 (logarithmic
 *  profile over short grass). */
export function windSpeedAt2m(speedMs: number, heightM: number): number {
  if (!Number.isFinite(speedMs) || speedMs < 0) {
    throw new RangeError(`Wind speed must be zero or more m/s, got ${speedMs}.`);
  }
  // Below about 0.1 m the log profile's argument (67.8 z − 5.42) drops under 1 and the formula breaks down, and
  // an anemometer under half a metre sits in the crop itself.
  if (!Number.isFinite(heightM) || heightM < 0.5 || heightM > 100) {
    throw new RangeError(`Wind measurement height must be between 0.5 and 100 m, got ${heightM} m.`);
  }
  // eq. 47's rounded constants give a factor of 1.0002 at 2 m itself; a 2 m reading needs no adjustment.
  if (heightM === 2) return speedMs;
  return speedMs * (4.87 / Math.log(67.8 * heightM - 5.42));
}

export type HumiditySource = 'dew-point' | 'rh-max-min' | 'rh-max' | 'rh-mean' | 'min-temperature';
export type RadiationSource = 'measured' | 'sunshine-hours' | 'temperature-range';

/** Every intermediate of a Penman–Monteith day, named as in FAO-56, so a result can be explained or checked. */
export interface PenmanMonteithDetail {
  et0Mm: number;
  meanTempC: number;
  slopeKPaPerC: number; // Δ, eq. 13 at Tmean
  pressureKPa: number; // P, eq. 7
  psychrometricKPaPerC: number; // γ, eq. 8
  saturationVapourPressureKPa: number; // es, eq. 12
  actualVapourPressureKPa: number; // ea
  humiditySource: HumiditySource;
  windAt2mMs: number; // u2
  extraterrestrialMJ: number; // Ra
  daylightHours: number; // N
  solarMJ: number; // Rs
  radiationSource: RadiationSource;
  clearSkySolarMJ: number; // Rso, eq. 37
  netShortwaveMJ: number; // Rns, eq. 38
  netLongwaveMJ: number; // Rnl, eq. 39
  netRadiationMJ: number; // Rn, eq. 40
  soilHeatFluxMJ: number; // G
  radiationTermMm: number; // 0.408 Δ (Rn − G) / denominator
  aerodynamicTermMm: number; // γ 900/(T+273) u2 (es − ea) / denominator
}

/** ea by the best humidity data the day has — FAO-56 chapter 3 order of preference: dew point (eq. 14),
 *  RHmax with RHmin (eq. 17), RHmax alone (eq. 18), RHmean (eq. 19), else Tdew ≈ Tmin (eq. 48). */
function actualVapourPressure(day: DailyWeather): { kPa: number; source: HumiditySource } {
  if (day.dewPointC !== undefined) {
    assertAirTempC(day.dewPointC, 'Dew point');
    if (day.dewPointC > day.tMaxC) {
      throw new RangeError(`Dew point (${day.dewPointC} °C) is above the maximum temperature (${day.tMaxC} °C).`);
    }
    return { kPa: actualVapourPressureFromDewPointKPa(day.dewPointC), source: 'dew-point' };
  }
  if (day.rhMaxPct !== undefined && day.rhMinPct !== undefined) {
    return { kPa: actualVapourPressureFromRhMaxMinKPa(day.tMaxC, day.tMinC, day.rhMaxPct, day.rhMinPct), source: 'rh-max-min' };
  }
  if (day.rhMaxPct !== undefined) {
    return { kPa: actualVapourPressureFromRhMaxKPa(day.tMinC, day.rhMaxPct), source: 'rh-max' };
  }
  if (day.rhMeanPct !== undefined) {
    return { kPa: actualVapourPressureFromRhMeanKPa(day.tMaxC, day.tMinC, day.rhMeanPct), source: 'rh-mean' };
  }
  if (day.rhMinPct !== undefined) assertRelativeHumidityPct(day.rhMinPct, 'Minimum relative humidity');
  // eq. 48 suits humid and sub-humid sites where the night air nears saturation; in arid climates it
  // overstates ea (the paper suggests Tdew ≈ Tmin − 2…3 °C there).
  return { kPa: actualVapourPressureFromDewPointKPa(day.tMinC), source: 'min-temperature' };
}

function solarRadiation(
  day: DailyWeather,
  extraterrestrialMJ: number,
  maxSunshineHours: number,
  hargreavesKRs: number,
): { mj: number; source: RadiationSource } {
  if (day.solarRadiationMJ !== undefined) {
    if (!Number.isFinite(day.solarRadiationMJ) || day.solarRadiationMJ < 0) {
      throw new RangeError(`Solar radiation must be zero or more MJ m⁻² d⁻¹, got ${day.solarRadiationMJ}.`);
    }
    return { mj: day.solarRadiationMJ, source: 'measured' };
  }
  if (day.sunshineHours !== undefined) {
    const hours = day.sunshineHours;
    // Allow for recorders rounding to the tenth of an hour; more than that over N is an error in the data.
    if (!Number.isFinite(hours) || hours < 0 || hours > maxSunshineHours + 0.25) {
      throw new RangeError(
        `Sunshine hours must be between 0 and the day's ${maxSunshineHours.toFixed(1)} daylight hours, got ${hours}.`,
      );
    }
    const relative = maxSunshineHours > 0 ? Math.min(1, hours / maxSunshineHours) : 0;
    return { mj: (ANGSTROM_AS + ANGSTROM_BS * relative) * extraterrestrialMJ, source: 'sunshine-hours' }; // eq. 35
  }
  return { mj: hargreavesKRs * Math.sqrt(day.tMaxC - day.tMinC) * extraterrestrialMJ, source: 'temperature-range' }; // eq. 50
}

function clearSkySolarRadiationMJ(elevationM: number, extraterrestrialMJ: number): number {
  return (0.75 + 2e-5 * elevationM) * extraterrestrialMJ; // eq. 37
}

/** ETo by FAO Penman–Monteith with every intermediate — FAO-56 eq. 6. */
export function penmanMonteithDetail(day: DailyWeather, options: Et0Options = {}): PenmanMonteithDetail {
  assertAirTempC(day.tMaxC, 'Maximum temperature');
  assertAirTempC(day.tMinC, 'Minimum temperature');
  if (day.tMinC > day.tMaxC) {
    throw new RangeError(`Minimum temperature (${day.tMinC} °C) is above the maximum (${day.tMaxC} °C).`);
  }
  const soilHeatFluxMJ = options.soilHeatFluxMJ ?? 0;
  if (!Number.isFinite(soilHeatFluxMJ)) throw new RangeError(`Soil heat flux must be a number, got ${soilHeatFluxMJ}.`);
  const hargreavesKRs = options.hargreavesKRs ?? HARGREAVES_KRS_INTERIOR;
  if (!Number.isFinite(hargreavesKRs) || hargreavesKRs <= 0 || hargreavesKRs > 0.3) {
    throw new RangeError(`Hargreaves kRs must be between 0 and 0.3 (FAO-56 uses 0.16–0.19), got ${hargreavesKRs}.`);
  }

  const meanTempC = (day.tMaxC + day.tMinC) / 2; // eq. 9
  const slopeKPaPerC = saturationVapourPressureSlopeKPaPerC(meanTempC);
  const pressureKPa = atmosphericPressureKPa(day.elevationM);
  const psychrometricKPaPerC = psychrometricConstantKPaPerC(pressureKPa);
  const saturationKPa = meanSaturationVapourPressureKPa(day.tMaxC, day.tMinC);
  const humidity = actualVapourPressure(day);
  const windAt2mMs = windSpeedAt2m(day.windSpeedMs, day.windHeightM ?? 2);

  const extraterrestrialMJ = extraterrestrialRadiation(day.latitudeDeg, day.dayOfYear);
  const maxSunshineHours = daylightHours(day.latitudeDeg, day.dayOfYear);
  const clearSkySolarMJ = clearSkySolarRadiationMJ(day.elevationM, extraterrestrialMJ);
  const estimated = solarRadiation(day, extraterrestrialMJ, maxSunshineHours, hargreavesKRs);
  // An estimate cannot exceed clear-sky radiation (a wide temperature range with the coastal kRs can say it
  // does); a measured value is left alone, though eq. 39 still caps its ratio to Rso at 1.0.
  const solar = estimated.source === 'measured' ? estimated : { ...estimated, mj: Math.min(estimated.mj, clearSkySolarMJ) };
  const netShortwaveMJ = (1 - GRASS_REFERENCE_ALBEDO) * solar.mj; // eq. 38
  // eq. 39 caps Rs/Rso at 1.0. In polar night there is no Rso to divide by; the paper's hourly advice is to
  // carry the ratio over from daylight, and with no daylight we take the clear-sky value (1.0).
  const relativeShortwave = clearSkySolarMJ > 0 ? Math.min(1, solar.mj / clearSkySolarMJ) : 1;
  const tMaxK = day.tMaxC + 273.16;
  const tMinK = day.tMinC + 273.16;
  const netLongwaveMJ =
    STEFAN_BOLTZMANN_MJ_PER_K4_M2_DAY *
    ((tMaxK ** 4 + tMinK ** 4) / 2) *
    (0.34 - 0.14 * Math.sqrt(humidity.kPa)) *
    (1.35 * relativeShortwave - 0.35);
  const netRadiationMJ = netShortwaveMJ - netLongwaveMJ; // eq. 40

  const denominator = slopeKPaPerC + psychrometricKPaPerC * (1 + 0.34 * windAt2mMs);
  const radiationTermMm = (MJ_TO_MM_WATER * slopeKPaPerC * (netRadiationMJ - soilHeatFluxMJ)) / denominator;
  const aerodynamicTermMm =
    (psychrometricKPaPerC * (900 / (meanTempC + 273)) * windAt2mMs * (saturationKPa - humidity.kPa)) / denominator;
  // A negative sum means dew forms on the reference grass; as a water loss for the seed zone that is zero.
  const et0Mm = Math.max(0, radiationTermMm + aerodynamicTermMm);

  return {
    et0Mm,
    meanTempC,
    slopeKPaPerC,
    pressureKPa,
    psychrometricKPaPerC,
    saturationVapourPressureKPa: saturationKPa,
    actualVapourPressureKPa: humidity.kPa,
    humiditySource: humidity.source,
    windAt2mMs,
    extraterrestrialMJ,
    daylightHours: maxSunshineHours,
    solarMJ: solar.mj,
    radiationSource: solar.source,
    clearSkySolarMJ,
    netShortwaveMJ,
    netLongwaveMJ,
    netRadiationMJ,
    soilHeatFluxMJ,
    radiationTermMm,
    aerodynamicTermMm,
  };
}

/** ETo, mm/day, by FAO Penman–Monteith — FAO-56 eq. 6, daily step (G = 0 unless given). */
export function et0PenmanMonteith(day: DailyWeather, options: Et0Options = {}): number {
  return penmanMonteithDetail(day, options).et0Mm;
}

/** ETo, mm/day, by Hargreaves from temperature alone — FAO-56 eq. 52, for when humidity, wind and radiation
 *  are all missing. */
export function et0Hargreaves(day: { tMaxC: number; tMinC: number; latitudeDeg: number; dayOfYear: number }): number {
  assertAirTempC(day.tMaxC, 'Maximum temperature');
  assertAirTempC(day.tMinC, 'Minimum temperature');
  if (day.tMinC > day.tMaxC) {
    throw new RangeError(`Minimum temperature (${day.tMinC} °C) is above the maximum (${day.tMaxC} °C).`);
  }
  const meanTempC = (day.tMaxC + day.tMinC) / 2;
  const extraterrestrialMm = MJ_TO_MM_WATER * extraterrestrialRadiation(day.latitudeDeg, day.dayOfYear);
  // Below −17.8 °C mean the formula turns negative; no evaporation is the physical reading.
  return Math.max(0, 0.0023 * (meanTempC + 17.8) * Math.sqrt(day.tMaxC - day.tMinC) * extraterrestrialMm);
}
