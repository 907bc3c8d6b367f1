/**
 * The budget sides of the built-in sensor kinds, kept apart from the kinds themselves
 * (`registry.ts`) so that an application that only converts does not carry them: only the budget
 * imports this module. A built-in kind is its module, its budget module, and one line in each
 * registry; a kind made outside the package carries its budget side in `SensorKind.budget`.
 */
import { BridgeworkError } from '@bridgework/core';
import type { Fields } from '../spec/schema.js';
import { rtdKind } from './rtd.js';
import { rtdBudget } from './rtdBudget.js';
import type { SensorKind, SensorKindBudget } from './SensorKind.js';
import { strainGaugeKind } from './strainGauge.js';
import { strainGaugeBudget } from './strainGaugeBudget.js';
import { thermistorKind } from './thermistor.js';
import { thermistorBudget } from './thermistorBudget.js';
import { transducerKind } from './transducer.js';
import { transducerBudget } from './transducerBudget.js';

/** The budget side of each built-in kind, by the kind's module (not its name: a kit may hold a kind of the same name). */
export const builtInKindBudgets: ReadonlyMap<SensorKind, SensorKindBudget> = new Map<
  SensorKind,
  SensorKindBudget
>([
  [strainGaugeKind as unknown as SensorKind, strainGaugeBudget as unknown as SensorKindBudget],
  [transducerKind as unknown as SensorKind, transducerBudget as unknown as SensorKindBudget],
  [rtdKind as unknown as SensorKind, rtdBudget as unknown as SensorKindBudget],
  [thermistorKind as unknown as SensorKind, thermistorBudget as unknown as SensorKindBudget],
]);

/**
 * The budget side of a kind: the built-in one's, or the kind's own `budget`.
 *
 * @throws {@link @bridgework/core!BridgeworkError} `missing-option` (`param` `sensor.kind`) for a
 *   kind that has neither: its channel converts, but its budget cannot be stated.
 */
export function budgetSideOf<F extends Fields>(kind: SensorKind<F>): SensorKindBudget<F> {
  const side =
    (builtInKindBudgets.get(kind as unknown as SensorKind) as SensorKindBudget<F> | undefined) ?? kind.budget;
  if (side === undefined) {
    throw new BridgeworkError(
      'missing-option',
      `sensor kind '${kind.name}' has no budget side (its module's \`budget.budgetInputs\`): its channel converts, but its uncertainty budget cannot be stated`,
      { param: 'sensor.kind', value: kind.name },
    );
  }
  return side;
}
