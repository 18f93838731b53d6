// Sunrise and sunset for the daylight rule (NOAA GML "General Solar Position Calculations").
import { describe, expect, it } from 'vitest';
import { equationOfTimeMinutes, solarDeclinationRad, standardMeridianDeg, sunTimes } from '@/lib/schedule/daylight';

describe('daylight', () => {
  it('gives the geometric day length of FAO-56 Example 9: 3 September at 20° S → N = 11.7 h', () => {
    // FAO-56 uses a zenith of exactly 90° (ωs = arccos(−tan φ tan δ), eq. 25; N = 24 ωs / π, eq. 34). Its
    // one-term declination (eq. 24) runs about 1° under NOAA's series in early September, worth ~0.08 h here.
    const sun = sunTimes('2027-09-03', -20, 0, 'UTC', 90);
    expect(Math.abs(sun.daylightHours - 11.7)).toBeLessThan(0.1);
  });

  it('gives a declination near FAO-56 Example 8\'s for 3 September (δ = 0.120 rad), and the almanac\'s about 7.8°', () => {
    // FAO-56 eq. 24 is a one-term fit; NOAA's Fourier series is closer to the almanac (about +7.8° on
    // 3 September, from memory), so the two differ by under 0.02 rad.
    expect(Math.abs(solarDeclinationRad('2027-09-03') - 0.12)).toBeLessThan(0.02);
    expect((solarDeclinationRad('2027-09-03') * 180) / Math.PI).toBeCloseTo(7.8, 0);
  });

  it('reproduces the equation of time extremes (about +16.4 min early November, −14.2 min mid February; almanac values, from memory)', () => {
    expect(equationOfTimeMinutes('2027-11-03')).toBeCloseTo(16.4, 0);
    expect(equationOfTimeMinutes('2027-02-11')).toBeCloseTo(-14.2, 0);
  });

  it('makes the equinox day at the equator a few minutes longer than 12 h (refraction and the sun\'s radius; NOAA zenith 90.833°)', () => {
    const sun = sunTimes('2027-03-20', 0, 0, 'UTC');
    expect(sun.daylightHours * 60).toBeGreaterThan(12 * 60 + 5);
    expect(sun.daylightHours * 60).toBeLessThan(12 * 60 + 9);
  });

  it('puts solar noon on the local clock: later in DST, by longitude, by the equation of time', () => {
    // 90.2° W in America/Chicago (standard meridian 90° W): solar noon ≈ 12:00 CST + 0.8 min − EoT; in
    // mid September the EoT is about +5 min, so ≈ 12:56 CDT.
    const sun = sunTimes('2027-09-14', 38.6, -90.2, 'America/Chicago');
    const clock = new Intl.DateTimeFormat('en-GB', { timeZone: 'America/Chicago', hour: '2-digit', minute: '2-digit' }).format(sun.solarNoonMs);
    expect(clock).toMatch(/^12:5[4-8]$/);
    expect(sun.sunriseMs! < sun.solarNoonMs && sun.solarNoonMs < sun.sunsetMs!).toBe(true);
  });

  it('falls back to the standard meridian of the zone when the longitude is unknown', () => {
    expect(standardMeridianDeg('America/Chicago', 2027)).toBe(-90);
    expect(standardMeridianDeg('Australia/Sydney', 2027)).toBe(150);
    expect(sunTimes('2027-09-14', 38.6, null, 'America/Chicago').longitudeEstimated).toBe(true);
  });

  it('has no sunrise in polar night', () => {
    const sun = sunTimes('2027-12-21', 80, 0, 'UTC');
    expect(sun.sunriseMs).toBeNull();
    expect(sun.daylightHours).toBe(0);
  });
});
