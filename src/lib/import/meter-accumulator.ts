/** Growable typed columns holding one meter's rows while the file streams in. */

export class F64Column {
  data: Float64Array;
  length = 0;
  constructor(capacity = 4096) {
    this.data = new Float64Array(capacity);
  }
  push(v: number): void {
    if (this.length === this.data.length) {
      const next = new Float64Array(this.data.length * 2);
      next.set(this.data);
      this.data = next;
    }
    this.data[this.length++] = v;
  }
  view(): Float64Array {
    return this.data.subarray(0, this.length);
  }
}

export class I32Column {
  data: Int32Array;
  length = 0;
  constructor(capacity = 4096) {
    this.data = new Int32Array(capacity);
  }
  push(v: number): void {
    if (this.length === this.data.length) {
      const next = new Int32Array(this.data.length * 2);
      next.set(this.data);
      this.data = next;
    }
    this.data[this.length++] = v;
  }
  view(): Int32Array {
    return this.data.subarray(0, this.length);
  }
}

/**
 * One meter's raw rows in file order. Values are already scaled to kilo-units and
 * multiplied by the meter multiplier; demand units are converted to energy later, when
 * the interval length is known. NaN marks a missing reading.
 */
export class MeterRows {
  /** Instants as written (start or end of interval, not yet shifted), UTC ms. */
  readonly stamps = new F64Column();
  /** 1-based line numbers in the file. */
  readonly lines = new I32Column();
  readonly active = new F64Column();
  /** Lagging register, net signed value, or Q1 + Q2; unused for `none`. */
  readonly reactiveA = new F64Column();
  /** Leading register or Q3 + Q4. */
  readonly reactiveB = new F64Column();
  readonly apparent: F64Column | null;
  readonly pf: F64Column | null;
  /** Rows where quadrant Q2 or Q3 (reactive while exporting) was non-zero. */
  exportQuadrantRows = 0;

  constructor(
    readonly meterId: string,
    /** Repeated-hour bookkeeping: shared by all meters of a row in the column-set layout. */
    readonly clock: ClockContext,
    hasApparent: boolean,
    hasPf: boolean,
  ) {
    this.apparent = hasApparent ? new F64Column() : null;
    this.pf = hasPf ? new F64Column() : null;
  }

  get length(): number {
    return this.stamps.length;
  }

  /** Appends one interval's values (one capacity check for the five core columns). */
  append(stamp: number, line: number, active: number, a: number, b: number): void {
    const s = this.stamps;
    if (s.length === s.data.length) {
      this.stamps.push(stamp);
      this.lines.push(line);
      this.active.push(active);
      this.reactiveA.push(a);
      this.reactiveB.push(b);
      return;
    }
    const i = s.length;
    s.data[i] = stamp;
    this.lines.data[i] = line;
    this.active.data[i] = active;
    this.reactiveA.data[i] = a;
    this.reactiveB.data[i] = b;
    s.length = this.lines.length = this.active.length = this.reactiveA.length = this.reactiveB.length = i + 1;
  }
}

/** How the wall readings of one stream of stamps were resolved around clock changes. */
export class ClockContext {
  /** Wall readings seen in a repeated (clocks-back) hour, with how often each appeared. */
  readonly repeatedSeen = new Map<number, number>();
  readEarlier = 0;
  readLater = 0;
  readonly firstRows: number[] = [];
}
