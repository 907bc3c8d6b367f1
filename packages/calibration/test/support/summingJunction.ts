/**
 * Independent reference for the summing junction, on the suite's one nodal solver
 * (test/support/nodal.ts: modified nodal analysis in 40-digit arithmetic). Unlike the library's
 * solver, which merges the nodes a zero-ohm trim joins, each zero-ohm connection here is an ideal
 * 0 V source with its own current unknown (Ho, Ruehli and Brennan 1975), so every node is kept.
 * Ground is 'gnd'.
 */
import {
  bigScaled,
  solveNetwork,
  type Resistor,
  type VoltageSource,
} from '../../../../test/support/nodal.js';

/** The summing junction as a network (1 V supply), written from the topology's description. */
export function junctionNetwork(options: {
  readonly cellOhms: readonly number[];
  readonly trimsOhms: readonly number[];
  readonly cellRatios: readonly number[];
  readonly trimPlacement: 'positive-excitation' | 'both-excitation';
  readonly summingOhms: number;
  readonly meterOhms: number;
}): { resistors: Resistor[]; sources: VoltageSource[] } {
  const resistors: Resistor[] = [];
  const sources: VoltageSource[] = [{ plus: 'supply+', minus: 'gnd', volts: 1 }];
  const link = (a: string, b: string, ohms: number): void => {
    if (ohms === 0) sources.push({ plus: a, minus: b, volts: 0 });
    else resistors.push({ a, b, ohms });
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
    // The arms at 40 digits: R·(1 ± x) rounded to a double would change the cell's ratio by about
    // ε, which is 1e-12 of a small cell ratio (the library forms the change exactly from x).
    const arm = (a: string, b: string, sign: 1 | -1): void => {
      resistors.push({ a, b, ohms: r * (1 + sign * x), exactOhms: bigScaled(r, sign * x) });
    };
    arm(`c${i}.E+`, `c${i}.S-`, 1);
    arm(`c${i}.S-`, `c${i}.E-`, -1);
    arm(`c${i}.E-`, `c${i}.S+`, 1);
    arm(`c${i}.S+`, `c${i}.E+`, -1);
    link(`c${i}.S+`, 'bus+', options.summingOhms);
    link(`c${i}.S-`, 'bus-', options.summingOhms);
  });
  if (Number.isFinite(options.meterOhms)) link('bus+', 'bus-', options.meterOhms);
  return { resistors, sources };
}

/** The junction's output per volt by nodal analysis at 40 digits, as a double. */
export function junctionRatio(options: Parameters<typeof junctionNetwork>[0]): number {
  const s = solveNetwork({ ...junctionNetwork(options), ground: 'gnd' });
  return s.volts('bus+').minus(s.volts('bus-')).toNumber();
}
