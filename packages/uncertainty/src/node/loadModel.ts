/// <reference types="node" preserve="true" />
/** Loading a model module, shared by the pool's main thread and its workers. */
import { BridgeworkError, formatValue, isBridgeworkError } from '@bridgework/core';

function importFailure(href: string, error: unknown): BridgeworkError {
  if (isBridgeworkError(error)) return error;
  const code = (error as { code?: unknown } | null)?.code;
  const text = error instanceof Error ? `${error.name}: ${error.message}` : formatValue(error);
  if (code === 'ERR_MODULE_NOT_FOUND' || code === 'ENOENT' || code === 'ERR_UNSUPPORTED_DIR_IMPORT') {
    return new BridgeworkError(
      'io-error',
      `\`model.module\` must name a module that can be imported; ${href} was not found (${text})`,
      { param: 'model.module', value: href, cause: error },
    );
  }
  return new BridgeworkError('model-failed', `\`model.module\` ${href} failed to load: ${text}`, {
    param: 'model.module',
    value: href,
    cause: error,
  });
}

/**
 * Imports `href` and returns its export `exportName` — or, with an argument, what that export
 * (a factory) returns when called with it. The model's form is checked later, against the inputs.
 *
 * @throws `io-error` when the module is not found; `model-failed` when it (or the factory)
 *   throws; `wrong-type` when the export is missing, or not a function where a factory is needed.
 */
export async function loadModelExport(
  href: string,
  exportName: string,
  hasArgument: boolean,
  argument: unknown,
): Promise<unknown> {
  let imported: Record<string, unknown>;
  try {
    imported = (await import(href)) as Record<string, unknown>;
  } catch (error) {
    throw importFailure(href, error);
  }
  const candidate = imported[exportName];
  if (!hasArgument) {
    if (typeof candidate === 'function' || (typeof candidate === 'object' && candidate !== null))
      return candidate;
    throw new BridgeworkError(
      'wrong-type',
      `\`model.exportName\` must name a model exported by ${href} (a function, or { order, evaluate }); '${exportName}' is ${typeof candidate}`,
      { param: 'model.exportName', value: exportName },
    );
  }
  if (typeof candidate !== 'function') {
    throw new BridgeworkError(
      'wrong-type',
      `\`model.exportName\` must name a function exported by ${href} that makes the model from \`model.argument\`; '${exportName}' is ${typeof candidate}`,
      { param: 'model.exportName', value: exportName },
    );
  }
  try {
    return (candidate as (argument: unknown) => unknown)(argument);
  } catch (error) {
    if (isBridgeworkError(error)) throw error;
    const text = error instanceof Error ? `${error.name}: ${error.message}` : formatValue(error);
    throw new BridgeworkError(
      'model-failed',
      `\`model.exportName\` '${exportName}' of ${href} threw ${text} when called with \`model.argument\``,
      { param: 'model.argument', cause: error },
    );
  }
}
