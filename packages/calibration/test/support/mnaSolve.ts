/**
 * Independent reference for the summing junction: modified nodal analysis (MNA) of a netlist in
 * 40-digit decimal.js. Unlike the library's solver it keeps every node, treats each zero-ohm
 * connection and the supply as a voltage source with its own current unknown (Ho, Ruehli and
 * Brennan 1975), and solves by Gauss–Jordan elimination with partial pivoting. Ground is 'gnd'.
 */
import { Decimal } from 'decimal.js';
import { exactDecimalString } from '@bridgework/core';

const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_EVEN });
type Big = Decimal;

export type Element =
  | { readonly kind: 'resistor'; readonly a: string; readonly b: string; readonly ohms: number }
  | { readonly kind: 'source'; readonly a: string; readonly b: string; readonly volts: number };

/** Node voltages relative to 'gnd', as 40-digit decimals. */
export function mnaSolve(elements: readonly Element[]): Map<string, Big> {
  const nodes = [...new Set(elements.flatMap((e) => [e.a, e.b]))].filter((n) => n !== 'gnd');
  const sources = elements.filter((e) => e.kind === 'source');
  const size = nodes.length + sources.length;
  const a = Array.from({ length: size }, () => Array.from({ length: size + 1 }, () => new D(0)));
  const at = (n: string): number => nodes.indexOf(n);
  const addTo = (r: number, c: number, v: Big): void => {
    if (r >= 0 && c >= 0) a[r]![c] = a[r]![c]!.plus(v);
  };
  let s = 0;
  for (const e of elements) {
    const i = at(e.a);
    const j = at(e.b);
    if (e.kind === 'resistor') {
      const g = new D(1).div(new D(exactDecimalString(e.ohms)));
      addTo(i, i, g);
      addTo(j, j, g);
      addTo(i, j, g.neg());
      addTo(j, i, g.neg());
    } else {
      const k = nodes.length + s++;
      addTo(i, k, new D(1));
      addTo(j, k, new D(-1));
      addTo(k, i, new D(1));
      addTo(k, j, new D(-1));
      a[k]![size] = new D(exactDecimalString(e.volts));
    }
  }
  for (let col = 0; col < size; col++) {
    let pivot = col;
    for (let r = col + 1; r < size; r++) if (a[r]![col]!.abs().gt(a[pivot]![col]!.abs())) pivot = r;
    [a[col], a[pivot]] = [a[pivot]!, a[col]!];
    const p = a[col]![col]!;
    a[col] = a[col]!.map((v) => v.div(p));
    for (let r = 0; r < size; r++) {
      if (r === col || a[r]![col]!.isZero()) continue;
      const f = a[r]![col]!;
      a[r] = a[r]!.map((v, c) => v.minus(f.times(a[col]![c]!)));
    }
  }
  const out = new Map<string, Big>([['gnd', new D(0)]]);
  nodes.forEach((n, i) => out.set(n, a[i]![size]!));
  return out;
}

/** The summing junction as a netlist (1 V supply), written from the topology's description. */
export function junctionNetlist(options: {
  readonly cellOhms: readonly number[];
  readonly trimsOhms: readonly number[];
  readonly cellRatios: readonly number[];
  readonly trimPlacement: 'positive-excitation' | 'both-excitation';
  readonly summingOhms: number;
  readonly meterOhms: number;
}): Element[] {
  const e: Element[] = [{ kind: 'source', a: 'supply+', b: 'gnd', volts: 1 }];
  const link = (a: string, b: string, ohms: number): void => {
    e.push(ohms === 0 ? { kind: 'source', a, b, volts: 0 } : { kind: 'resistor', a, b, ohms });
  };
  options.cellOhms.forEach((r, i) => {
    const t = options.trimsOhms[i]!;
    const x = options.cellRatios[i]!;
    // Arms in ring order: +E → R1 → −S → R2 → −E → R3 → +S → R4 → +E.
    if (options.trimPlacement === 'both-excitation') {
      link('supply+', `c${i}.E+`, t / 2);
      link(`c${i}.E-`, 'gnd', t / 2);
    } else {
      link('supply+', `c${i}.E+`, t);
      link(`c${i}.E-`, 'gnd', 0);
    }
    link(`c${i}.E+`, `c${i}.S-`, r * (1 + x));
    link(`c${i}.S-`, `c${i}.E-`, r * (1 - x));
    link(`c${i}.E-`, `c${i}.S+`, r * (1 + x));
    link(`c${i}.S+`, `c${i}.E+`, r * (1 - x));
    link(`c${i}.S+`, 'bus+', options.summingOhms);
    link(`c${i}.S-`, 'bus-', options.summingOhms);
  });
  if (Number.isFinite(options.meterOhms)) link('bus+', 'bus-', options.meterOhms);
  return e;
}

/** The junction's output per volt by MNA, as a double. */
export function junctionRatio(options: Parameters<typeof junctionNetlist>[0]): number {
  const v = mnaSolve(junctionNetlist(options));
  return v.get('bus+')!.minus(v.get('bus-')!).toNumber();
}
