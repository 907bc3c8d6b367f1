import { designFirmwareConstants, firmwareCost } from '@bridgework/firmware';
for (const target of [0.5, 0.01, 0.001]) {
  const d = designFirmwareConstants({
    name: 'Strut strain',
    exact: (c) => (2000 * (c / 2048)) / (1 + 0.004 * (c / 2048)),
    codeMin: -2048,
    codeMax: 2047,
    quantityUnit: 'µε',
    targetError: target,
    outputUnit: String(target / 5),
    hardwareDivide: true,
  });
  console.log(
    target,
    (['fixed', 'float32', 'float64'] as const)
      .map(
        (t) =>
          `${t}:${d[t]!.kind}/${(d[t] as any).degree ?? ''}/${(d[t] as any).segmentCount ?? ''} ${firmwareCost(d[t]!).cost.toFixed(1)} ${d.totals![t]!.bound.toExponential(2)}`,
      )
      .join('  '),
  );
}
