/** A map from a data interval onto a pixel interval; `invert` maps back. */
export interface Scale {
  (value: number): number;
  invert(px: number): number;
  domain: readonly [number, number];
  range: readonly [number, number];
}

/** A linear scale from [d0, d1] onto [r0, r1]. */
export function linearScale(domain: readonly [number, number], range: readonly [number, number]): Scale {
  const [d0, d1] = domain;
  const [r0, r1] = range;
  const slope = d1 === d0 ? 0 : (r1 - r0) / (d1 - d0);
  const scale = ((value: number) => r0 + (value - d0) * slope) as Scale;
  scale.invert = (px: number) => (slope === 0 ? d0 : d0 + (px - r0) / slope);
  scale.domain = domain;
  scale.range = range;
  return scale;
}

/** A logarithmic scale from [d0, d1] (both > 0) onto [r0, r1]: equal ratios take equal distances. */
export function logScale(domain: readonly [number, number], range: readonly [number, number]): Scale {
  const inner = linearScale([Math.log(domain[0]), Math.log(domain[1])], range);
  const scale = ((value: number) => inner(Math.log(value))) as Scale;
  scale.invert = (px: number) => Math.exp(inner.invert(px));
  scale.domain = domain;
  scale.range = range;
  return scale;
}

/**
 * Tick values for a log axis: 1, 2 and 5 times each power of ten inside the domain; when those
 * would be more than `maxTicks`, 1 and 5 times; then the powers of ten; then every other one.
 */
export function logTicks([from, to]: readonly [number, number], maxTicks = 10): number[] {
  if (!(from > 0) || !(to > from)) return [];
  const firstDecade = Math.floor(Math.log10(from));
  const lastDecade = Math.ceil(Math.log10(to));
  const inside = (value: number) => value >= from * (1 - 1e-9) && value <= to * (1 + 1e-9);
  let ticks: number[] = [];
  for (const steps of [[1, 2, 5], [1, 5], [1]]) {
    ticks = [];
    for (let decade = firstDecade; decade <= lastDecade; decade++) {
      for (const step of steps) {
        const value = Number((step * 10 ** decade).toPrecision(6));
        if (inside(value)) ticks.push(value);
      }
    }
    if (ticks.length <= maxTicks) return ticks;
  }
  return ticks.filter((_, index) => index % 2 === 0);
}

/** Tick values for a linear axis on a 1-2-5 step, at most about `maxTicks` of them. */
export function linearTicks([from, to]: readonly [number, number], maxTicks = 6): number[] {
  if (!(to > from) || maxTicks < 1) return [];
  const rough = (to - from) / maxTicks;
  const power = 10 ** Math.floor(Math.log10(rough));
  const step = [1, 2, 5, 10].map((factor) => factor * power).find((candidate) => candidate >= rough) ?? 10 * power;
  const ticks: number[] = [];
  for (let value = Math.ceil(from / step - 1e-9) * step; value <= to + step * 1e-9; value += step) ticks.push(Number(value.toPrecision(12)));
  return ticks;
}

/** A frequency tick's label: 50, 200, 1k, 2k, 10k (the axis title carries "Hz"). */
export function frequencyTickLabel(hz: number): string {
  return hz >= 1000 ? `${Number((hz / 1000).toPrecision(3))}k` : `${Number(hz.toPrecision(3))}`;
}
