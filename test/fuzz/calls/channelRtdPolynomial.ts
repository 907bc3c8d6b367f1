import * as rtdPolynomial from '@bridgework/channel/rtd-polynomial';
import { createChannel } from '@bridgework/channel';
import type { BaseCall } from '../harness.js';
import { fn, method } from './define.js';

const PKG = 'channel/rtd-polynomial';

// A Pt1000 on two wires read by a 16-bit converter: its polynomial's thousand segments of 64
// codes are checked in milliseconds, so an attack that turns `checkAllSegments` on stays fast.
const rtd = () =>
  createChannel({
    sensor: { kind: 'rtd', r0Ohms: 1000 },
    bridge: { wiring: 'two-wire', ohmsPerLead: 0.3 },
    excitation: { volts: 2.5 },
    amplifier: { gain: 4 },
    adc: { bits: 16, referenceVolts: 2.5, ratiometric: true },
    output: { quantity: 'temperature' },
  } as never);
const converter = () => rtdPolynomial.createRtdPolynomialConverter(rtd(), { checkAllSegments: false });
// Codes across the span, one at each rail (a rail code is a counted rejection, not an error).
const codes = () => Int32Array.of(0, 1500, 5630, -32_768, 32_767);

/** Base calls of @bridgework/channel/rtd-polynomial. */
export const channelRtdPolynomialCalls: readonly BaseCall[] = [
  fn(PKG, rtdPolynomial, 'createRtdPolynomialConverter', () => [rtd(), { checkAllSegments: true }]),
  method(
    PKG,
    'createRtdPolynomialConverter',
    converter,
    'convert',
    () => [codes(), new Float64Array(5), { maxLocations: 4 }],
    { nonFinite: ['values.*'] },
  ),
  method(PKG, 'createRtdPolynomialConverter', converter, 'segments', () => []),
];

/** Exports of @bridgework/channel/rtd-polynomial that are not fuzzed as calls (none). */
export const channelRtdPolynomialNotCalled: Readonly<Record<string, string>> = {};
