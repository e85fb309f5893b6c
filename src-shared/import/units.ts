/**
 * Units of effort and area, and the one unit each kind is converted to for
 * the analysis table: time in hours, distance in km, area in ha; trap-nights
 * and other counted units stay as they are.
 */
export const effortUnits = ['minutes', 'hours', 'km', 'm', 'trap-nights', 'visits', 'points'] as const;
export type EffortUnit = (typeof effortUnits)[number];
export const areaUnits = ['m2', 'ha', 'km2'] as const;
export type AreaUnit = (typeof areaUnits)[number];

export type EffortKind = 'time' | 'distance' | 'trap-nights' | 'visits' | 'points';

interface UnitInfo {
  readonly kind: EffortKind;
  /** Factor to the canonical unit of its kind. */
  readonly factor: number;
  readonly canonical: string;
  /** A plausible range for one visit's effort in the canonical unit (a value outside it is flagged, not refused). */
  readonly plausible: readonly [number, number];
}

/** Plausible ranges per visit: up to 12 hours, 50 km, 1000 trap-nights, 50 points (common practice for single survey visits; editable by the caller). */
const effortInfo: Record<EffortUnit, UnitInfo> = {
  minutes: { kind: 'time', factor: 1 / 60, canonical: 'hours', plausible: [1 / 60, 12] },
  hours: { kind: 'time', factor: 1, canonical: 'hours', plausible: [1 / 60, 12] },
  km: { kind: 'distance', factor: 1, canonical: 'km', plausible: [0.01, 50] },
  m: { kind: 'distance', factor: 1 / 1000, canonical: 'km', plausible: [0.01, 50] },
  'trap-nights': { kind: 'trap-nights', factor: 1, canonical: 'trap-nights', plausible: [1, 1000] },
  visits: { kind: 'visits', factor: 1, canonical: 'visits', plausible: [1, 100] },
  points: { kind: 'points', factor: 1, canonical: 'points', plausible: [1, 50] },
};

export function effortUnitInfo(unit: EffortUnit): UnitInfo {
  return effortInfo[unit];
}

/** Effort in the canonical unit of its kind (hours, km, trap-nights ...). */
export function toCanonicalEffort(value: number, unit: EffortUnit): number {
  return value * effortInfo[unit].factor;
}

/** Effort back in the unit it was written in (the inverse of toCanonicalEffort, rounded to 12 significant digits to undo the division's last-place error). */
export function fromCanonicalEffort(value: number, unit: EffortUnit): number {
  return Number((value / effortInfo[unit].factor).toPrecision(12));
}

const areaFactor: Record<AreaUnit, number> = { m2: 1e-4, ha: 1, km2: 100 };

/** Area in hectares. */
export function toHectares(value: number, unit: AreaUnit): number {
  return value * areaFactor[unit];
}

/** A unit named in a header, e.g. "Minutes", "Effort (h)", "Area (m²)", "Transect km". */
export function unitFromHeader(header: string): EffortUnit | AreaUnit | undefined {
  const h = header.toLowerCase();
  if (/m²|m2|sq\.?\s*m|square met/.test(h)) return 'm2';
  if (/km²|km2|sq\.?\s*km/.test(h)) return 'km2';
  if (/\bha\b|hectare/.test(h)) return 'ha';
  if (/\bmin(ute)?s?\b/.test(h)) return 'minutes';
  if (/\bh(ou)?rs?\b|\(h\)/.test(h)) return 'hours';
  if (/trap.?nights?/.test(h)) return 'trap-nights';
  if (/\bkm\b|kilomet/.test(h)) return 'km';
  if (/\(m\)|\bmet(re|er)s?\b/.test(h)) return 'm';
  return undefined;
}

export function isEffortUnit(u: string | undefined): u is EffortUnit {
  return (effortUnits as readonly string[]).includes(u ?? '');
}

export function isAreaUnit(u: string | undefined): u is AreaUnit {
  return (areaUnits as readonly string[]).includes(u ?? '');
}
