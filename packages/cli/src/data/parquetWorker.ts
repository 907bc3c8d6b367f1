/**
 * Entry of the Parquet encoder thread (see `createParquetWriter`): loads parquet-wasm at once,
 * then feeds the record batches it is sent (Arrow IPC streams) to the crate's streaming writer and
 * sends the file's bytes back in order. At most two chunks of bytes are unacknowledged at a time,
 * so a slow disk holds the encoder back instead of filling memory.
 */
import { parentPort } from 'node:worker_threads';
import { sendError } from './laneMessages.js';
import {
  encodeParquet,
  type ParquetReply,
  type ParquetRequest,
  type ParquetSettings,
} from './parquetSettings.js';

const port = parentPort;
if (port === null) throw new Error('parquetWorker.ts runs as a worker thread');
const loading = import('parquet-wasm/node');

const queue: Uint8Array[] = [];
let ended = false;
let unacknowledged = 0;
let wakePull: (() => void) | undefined;
let wakeOutput: (() => void) | undefined;

const send = (reply: ParquetReply, transfer: ArrayBuffer[] = []): void => {
  port.postMessage(reply, transfer);
};

port.on('message', (message: ParquetRequest) => {
  switch (message.type) {
    case 'start':
      void encode(message.settings);
      break;
    case 'batch':
      queue.push(message.ipc);
      wakePull?.();
      break;
    case 'end':
      ended = true;
      wakePull?.();
      break;
    case 'written':
      unacknowledged--;
      wakeOutput?.();
      break;
  }
});

async function encode(settings: ParquetSettings): Promise<void> {
  try {
    await encodeParquet(
      await loading,
      settings,
      async () => {
        while (queue.length === 0 && !ended) await new Promise<void>((r) => (wakePull = r));
        const ipc = queue.shift();
        if (ipc !== undefined) send({ type: 'taken' });
        return ipc;
      },
      async (value) => {
        while (unacknowledged >= 2) await new Promise<void>((r) => (wakeOutput = r));
        unacknowledged++;
        // A chunk is a fresh copy out of WebAssembly memory; a view of a larger buffer is copied
        // once more so that only its bytes cross.
        const bytes =
          value.byteOffset === 0 && value.byteLength === value.buffer.byteLength ? value : value.slice();
        send({ type: 'bytes', bytes }, [bytes.buffer as ArrayBuffer]);
      },
    );
    send({ type: 'done' });
  } catch (error) {
    send({ type: 'failed', error: sendError(error) });
  }
}
