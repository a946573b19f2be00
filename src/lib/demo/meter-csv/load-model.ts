/**
 * Invented load shapes for the demo plants: shifts, weekends, a holiday shutdown, motor
 * kvar on top of resistive kiln load, a small fixed capacitor that makes quiet nights
 * leading, and rooftop solar at the packaging plant. Deterministic from a seed.
 */
import { IANAZone } from 'luxon';

/** mulberry32: a small seeded PRNG with a 2^32 period; plenty for demo noise. */
export function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4_294_967_296;
  };
}

export interface PlantModel {
  /** Resistive / near-unity load (kilns, heaters, lighting), kW. */
  baseKw: number;
  /** Extra resistive load during shifts, kW. */
  shiftKw: number;
  /** Motor load during shifts (mills, fans, compressors), kW, and off-shift. */
  motorShiftKw: number;
  motorIdleKw: number;
  /** Motor PF (tan phi from it), lagging. */
  motorPf: number;
  /** Transformer and no-load magnetising kvar, always present. */
  magnetisingKvar: number;
  /** Fixed capacitor left connected, kvar (makes light-load nights leading). */
  fixedCapKvar: number;
  /** Local shift hours [start, end) on weekdays, and Saturday's end hour (0 = no Saturday shift). */
  shiftStart: number;
  shiftEnd: number;
  saturdayEnd: number;
  /** Summer months (1-12) with extra motor load (chillers, extraction) as a fraction. */
  summerMonths: number[];
  summerMotorBoost: number;
  /** Rooftop solar peak, kW (0 = none); solar noon hour and day length by month. */
  solarKw: number;
  /** Holiday shutdown: local [month, day] pairs with shift load off. */
  shutdown: [number, number][];
}

export interface LocalParts {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  /** 0 = Sunday. */
  weekday: number;
}

/** Local calendar parts of an instant, with luxon's offset cached per UTC hour. */
export function localClock(zoneName: string): (ms: number) => LocalParts {
  const zone = IANAZone.create(zoneName);
  const cache = new Map<number, number>();
  return (ms) => {
    const hourKey = Math.floor(ms / 3_600_000);
    let off = cache.get(hourKey);
    if (off === undefined) {
      off = zone.offset(ms);
      cache.set(hourKey, off);
    }
    const d = new Date(ms + off * 60_000);
    return { year: d.getUTCFullYear(), month: d.getUTCMonth() + 1, day: d.getUTCDate(), hour: d.getUTCHours(), minute: d.getUTCMinutes(), weekday: d.getUTCDay() };
  };
}

/** Solar output as a share of peak for a local time: a half-sine over the day length of the month (southern hemisphere when `south`). */
export function solarShare(p: LocalParts, south: boolean, cloud: number): number {
  const monthFromSolstice = south ? Math.abs(((p.month + 5) % 12) - 5.5) : Math.abs(((p.month + 11) % 12) - 5.5);
  // 14.5 h of daylight at midsummer, 9.5 h at midwinter (roughly latitude 34 degrees).
  const dayLength = 9.5 + (5 * (5.5 - monthFromSolstice)) / 5.5;
  const noon = 12.5;
  const h = p.hour + p.minute / 60 + 1 / 8;
  const x = (h - (noon - dayLength / 2)) / dayLength;
  if (x <= 0 || x >= 1) return 0;
  return Math.sin(Math.PI * x) ** 1.3 * cloud;
}

export interface IntervalValues {
  kw: number;
  kvar: number;
}

/** Average kW and signed kvar (+ lagging) of one interval. `dayNoise` and `cloud` are drawn once per local day. */
export function plantInterval(model: PlantModel, p: LocalParts, rnd: () => number, dayNoise: number, cloud: number, south: boolean): IntervalValues {
  const shut = model.shutdown.some(([m, d]) => m === p.month && d === p.day);
  const h = p.hour + p.minute / 60;
  const weekday = p.weekday >= 1 && p.weekday <= 5;
  const onShift = !shut && ((weekday && h >= model.shiftStart && h < model.shiftEnd) || (p.weekday === 6 && h >= model.shiftStart && h < model.saturdayEnd));
  // Ramp the first and last hour of a shift so the edges are not square.
  const end = weekday ? model.shiftEnd : model.saturdayEnd;
  const edge = onShift ? Math.min(1, h - model.shiftStart + 0.25, end - h) : 0;
  const summer = model.summerMonths.includes(p.month) ? 1 + model.summerMotorBoost : 1;
  const jitter = () => 1 + (rnd() - 0.5) * 0.12;
  const resistive = (model.baseKw * (shut ? 0.35 : 1) + model.shiftKw * Math.max(0, edge)) * jitter() * dayNoise;
  const motor = (onShift ? model.motorIdleKw + (model.motorShiftKw - model.motorIdleKw) * Math.max(0.3, edge) : model.motorIdleKw * (shut ? 0.4 : 1)) * summer * jitter() * dayNoise;
  const tanMotor = Math.tan(Math.acos(model.motorPf));
  const solar = model.solarKw * solarShare(p, south, cloud);
  const kw = resistive + motor - solar;
  const kvar = motor * tanMotor * (0.95 + rnd() * 0.1) + model.magnetisingKvar - model.fixedCapKvar;
  return { kw, kvar };
}
