/**
 * The physical circuit of a bridge on its cable, wire by wire, with an optional shunt, for the
 * 40-digit reference of test/support/nodal.ts. Written from the wiring descriptions in docs/conventions.md,
 * not from src/: the gauges sit at the specimen, completion resistors and the meter in the
 * instrument, and a shunt "at the instrument" connects to the instrument's terminals.
 *
 * Node names: `emf` (source EMF), `E+`/`E-` (instrument excitation terminals; `E-` is ground),
 * `S+`/`S-` (instrument signal terminals). Remote nodes carry a `g`/`h` prefix.
 */
import type { StrainArrangement } from '@bridgework/bridge';
import type { LeadWiring } from '@bridgework/core';
import { ratioOf, solveCircuit, type Resistor } from '../../../../test/support/nodal.js';

export interface PhysicalBridge {
  readonly arrangement: StrainArrangement;
  readonly gaugeOhms: number;
  readonly completionOhms: number;
  readonly sourceOhms: number;
  readonly wiring: LeadWiring | undefined;
  readonly ohmsPerLead: number;
}

export interface PhysicalShunt {
  readonly arm: 1 | 2 | 3 | 4;
  readonly placement: 'gauge' | 'instrument';
  readonly ohms: number;
}

/** Which arms hold gauges (unstrained, so all gauges are gaugeOhms). */
function gaugeArms(arrangement: StrainArrangement): readonly number[] {
  if (arrangement === 'quarter') return [1];
  if (arrangement === 'half-opposite') return [1, 3];
  if (arrangement.startsWith('half-')) return [1, 2];
  return [1, 2, 3, 4];
}

/** The output ratio of the physical circuit: V(S+) − V(S−) over the EMF (or over the sensed excitation, six-wire). */
export function physicalRatio(bridge: PhysicalBridge, shunt?: PhysicalShunt): number {
  const r: Resistor[] = [];
  const rl = bridge.ohmsPerLead;
  const gauges = gaugeArms(bridge.arrangement);
  const element = (arm: number): number => (gauges.includes(arm) ? bridge.gaugeOhms : bridge.completionOhms);
  // Each arm as [from node, to node] of its element, and its two terminals at the instrument.
  const elementNodes: Record<number, [string, string]> = {};
  const terminals: Record<number, [string, string]> = {};
  const wire = (a: string, b: string, ohms: number): void => {
    r.push({ a, b, ohms });
  };
  const emf = bridge.sourceOhms === 0 ? 'E+' : 'emf';
  if (bridge.sourceOhms > 0) wire('emf', 'E+', bridge.sourceOhms);
  let bridgeTop = 'E+';
  let bridgeBottom = 'E-';
  const wiring = bridge.wiring;

  if (wiring === 'four-wire' || wiring === 'six-wire') {
    // Excitation leads to the transducer; its S± leads carry no current (ideal meter).
    bridgeTop = 'gE+';
    bridgeBottom = 'gE-';
    wire('E+', bridgeTop, rl);
    wire(bridgeBottom, 'E-', rl);
    const sMinus = 'gS-';
    const sPlus = 'gS+';
    elementNodes[1] = [bridgeTop, sMinus];
    elementNodes[2] = [sMinus, bridgeBottom];
    elementNodes[3] = [sPlus, bridgeBottom];
    elementNodes[4] = [bridgeTop, sPlus];
    wire(sMinus, 'S-', rl);
    wire(sPlus, 'S+', rl);
  } else if (wiring === 'three-wire') {
    // Gauge 1 remote between g1 and G; lead 1 E+→g1; arm 2 = element then lead 2 back to E−;
    // the sense lead joins G to the instrument's S− terminal.
    wire('E+', 'g1', rl);
    elementNodes[1] = ['g1', 'G'];
    elementNodes[2] = ['G', 'g2'];
    wire('g2', 'E-', rl);
    wire('G', 'S-', rl);
    terminals[1] = ['E+', 'S-'];
    terminals[2] = ['S-', 'E-'];
    elementNodes[3] = ['S+', 'E-'];
    elementNodes[4] = ['E+', 'S+'];
  } else if (wiring === 'two-wire') {
    wire('E+', 'g1', rl);
    elementNodes[1] = ['g1', 'g1b'];
    wire('g1b', 'S-', rl);
    terminals[1] = ['E+', 'S-'];
    elementNodes[2] = ['S-', 'E-'];
    if (gauges.includes(3)) {
      wire('S+', 'h3', rl);
      elementNodes[3] = ['h3', 'h3b'];
      wire('h3b', 'E-', rl);
      terminals[3] = ['S+', 'E-'];
    } else {
      elementNodes[3] = ['S+', 'E-'];
    }
    elementNodes[4] = ['E+', 'S+'];
  } else {
    elementNodes[1] = ['E+', 'S-'];
    elementNodes[2] = ['S-', 'E-'];
    elementNodes[3] = ['S+', 'E-'];
    elementNodes[4] = ['E+', 'S+'];
  }
  for (const arm of [1, 2, 3, 4]) {
    const [a, b] = elementNodes[arm]!;
    wire(a, b, element(arm));
  }
  if (shunt !== undefined) {
    const [a, b] =
      shunt.placement === 'instrument' && terminals[shunt.arm] !== undefined
        ? terminals[shunt.arm]!
        : elementNodes[shunt.arm]!;
    wire(a, b, shunt.ohms);
  }
  const v = solveCircuit({ resistors: r, plus: emf, minus: 'E-', volts: 1 });
  const reference: [string, string] = wiring === 'six-wire' ? [bridgeTop, bridgeBottom] : [emf, 'E-'];
  return ratioOf(v, ['S+', 'S-'], reference);
}
