/**
 * Validates the shared shunt options and builds, once, everything the shunt functions need: the
 * installation's bridge (authoritative for where the leads sit), the equivalent shunted network
 * for the chosen placement, and the instrument's model for the indicated definitions.
 */
import { createStrainBridge, type StrainBridge, type StrainBridgeOptions } from '@bridgework/bridge';
import {
  BridgeworkError,
  checkInteger,
  checkOptions,
  checkOneOf,
  checkPositive,
  formatValue,
  type LeadsOptions,
} from '@bridgework/core';
import type { ShuntDefinition, ShuntPlacement } from '../shuntOptions.js';
import type { ArmIndex, ShuntNetwork } from './shuntNetwork.js';

const definitions: readonly ShuntDefinition[] = ['resistance-equivalent', 'exact', 'linear'];
const placements: readonly ShuntPlacement[] = ['gauge', 'instrument'];

/** Everything derived from the shared options. */
export interface StrainShuntSetup {
  readonly definition: ShuntDefinition;
  readonly gaugeFactor: number;
  /** +1 for arms 1 and 3 (a lower arm lowers the output), −1 for arms 2 and 4. */
  readonly sign: 1 | -1;
  /** Nominal resistance of the shunted arm's element (gauge or completion resistor), Ω. */
  readonly elementOhms: number;
  /** Two-terminal resistance the shunt branch spans, between the arm's two bridge nodes, Ω. */
  readonly spannedOhms: number;
  /** Resistance in series with the shunt inside its branch (the sense lead, or 0), Ω. */
  readonly branchSeriesOhms: number;
  /** The network the reading sees. */
  readonly network: ShuntNetwork;
  /** The instrument's conversion (the installation's bridge, with or without its leads). */
  readonly instrument: StrainBridge;
}

/** The keys every strain shunt function reads besides its own target. */
const sharedKeys = [
  'gaugeOhms',
  'gaugeFactor',
  'arm',
  'arrangement',
  'completionOhms',
  'poissonRatio',
  'leads',
  'sourceOhms',
  'placement',
  'definition',
  'instrumentModelsLeads',
] as const;

export function strainShuntSetup(options: unknown, target: 'shuntOhms' | 'strain'): StrainShuntSetup {
  const o = checkOptions('options', options, {
    known: [...sharedKeys, target],
    required: ['gaugeOhms', 'gaugeFactor', target],
  });
  if (o['leads'] !== undefined) {
    checkOptions('leads', o['leads'], {
      known: ['ohmsPerLead', 'wiring'],
      required: ['ohmsPerLead', 'wiring'],
    });
  }
  const definition =
    o['definition'] === undefined
      ? 'resistance-equivalent'
      : checkOneOf('definition', o['definition'], definitions);
  const placement =
    o['placement'] === undefined ? 'gauge' : checkOneOf('placement', o['placement'], placements);
  const arm = o['arm'] === undefined ? 1 : checkInteger('arm', o['arm'], { min: 1, max: 4 });
  const instrumentModelsLeads = o['instrumentModelsLeads'] ?? true;
  if (typeof instrumentModelsLeads !== 'boolean') {
    throw new BridgeworkError(
      'wrong-type',
      `\`instrumentModelsLeads\` must be a boolean; got ${formatValue(instrumentModelsLeads)}`,
      { param: 'instrumentModelsLeads', value: instrumentModelsLeads },
    );
  }
  const gaugeOhms = checkPositive('gaugeOhms', o['gaugeOhms']);
  const bridgeOptions = {
    arrangement: o['arrangement'] ?? 'quarter',
    gaugeFactor: o['gaugeFactor'],
    gaugeOhms,
    completionOhms: o['completionOhms'],
    poissonRatio: o['poissonRatio'],
    sourceOhms: o['sourceOhms'],
  } as StrainBridgeOptions;
  // The bridge package validates the rest and is the one authority on where leads sit.
  const installation = createStrainBridge(
    o['leads'] === undefined ? bridgeOptions : { ...bridgeOptions, leads: o['leads'] as LeadsOptions },
  );
  const bare = o['leads'] === undefined ? installation : createStrainBridge(bridgeOptions);
  const leads = installation === bare ? undefined : (o['leads'] as LeadsOptions);
  const wiring = leads?.wiring;
  const ohmsPerLead = leads?.ohmsPerLead ?? 0;

  if (placement === 'instrument' && (wiring === 'four-wire' || wiring === 'six-wire')) {
    throw new BridgeworkError(
      'invalid-option',
      `\`placement\` must be 'gauge' for a full bridge on a ${wiring} cable (a shunt inside the transducer); got 'instrument'`,
      { param: 'placement', value: placement, limit: ['gauge'] },
    );
  }

  const index = (arm - 1) as ArmIndex;
  const arms = installation.armsOhms(0);
  const elementOhms = bare.armsOhms(0)[index];
  // Exact (Sterbenz): the arm is within a factor of two of its element.
  const leadInArm = arms[index] - elementOhms;
  const series = installation.seriesOhms;

  let network: ShuntNetwork;
  let spannedOhms = elementOhms;
  let branchSeriesOhms = 0;
  if (placement === 'gauge' || leadInArm === 0) {
    network = { arms, index, base: elementOhms, outside: leadInArm, excitationScale: 1, sourceOhms: series };
  } else if (wiring === 'three-wire') {
    // The S− node G is at the gauge; the instrument reaches it through the sense lead (RL), so the
    // shunt branch is Rs + RL from the instrument terminal to G and the reading is taken at the
    // instrument end T of the sense lead. Eliminating G (a star of A = arm 1, B = arm 2 and RL) by
    // the star–delta transform leaves an ordinary bridge read at T: arm 1 = N/B, arm 2 = N/A, and
    // N/RL across the excitation, with N = A·RL + RL·B + A·B (Kennelly, 1899). The shunt is across
    // N/B (arm 1) or N/A (arm 2); the load N/RL folds into the source by Thevenin's theorem.
    const a = arms[0];
    const b = arms[1];
    const rl = ohmsPerLead;
    const arm1 = a + rl * (1 + a / b); // N/B
    const arm2 = b + rl * (1 + b / a); // N/A
    const across = a + b + (a * b) / rl; // N/RL
    network = {
      arms: [arm1, arm2, arms[2], arms[3]],
      index,
      base: index === 0 ? arm1 : arm2,
      outside: 0,
      excitationScale: across / (across + series),
      sourceOhms: (series * across) / (across + series),
    };
    spannedOhms = arms[index];
    branchSeriesOhms = rl;
  } else {
    // Two-wire at the instrument: the shunt spans the gauge and both of its leads.
    network = { arms, index, base: arms[index], outside: 0, excitationScale: 1, sourceOhms: series };
    spannedOhms = arms[index];
  }

  return {
    definition,
    gaugeFactor: installation.gaugeFactor,
    sign: index % 2 === 0 ? 1 : -1,
    elementOhms,
    spannedOhms,
    branchSeriesOhms,
    network,
    instrument: instrumentModelsLeads ? installation : bare,
  };
}
