/**
 * Test helper: the shared `toThrowBridgeworkError` matcher takes a function, so an awaited
 * rejection is turned into a function that re-throws it (or returns, if nothing was thrown):
 * `expect(await caught(promise)).toThrowBridgeworkError('file-exists', { param })`.
 */
export async function caught(promise: Promise<unknown>): Promise<() => void> {
  try {
    await promise;
  } catch (e) {
    return () => {
      throw e;
    };
  }
  return () => undefined;
}
