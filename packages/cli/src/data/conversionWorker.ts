/**
 * Entry of a conversion worker thread (see {@link startConversionLanes}): loads the channel
 * package at once (while the main thread reads the channel file), makes the run's channels from
 * their specs when told, then converts each block it is sent with the same block runner as the
 * main thread's one-thread path, into the shared memory the main thread gave it.
 */
import { parentPort } from 'node:worker_threads';
import { createBlockRunner, type BlockDone, type BlockJob } from './blockConversion.js';
import { sendError, type LaneReply, type LaneRequest } from './laneMessages.js';

const port = parentPort;
if (port === null) throw new Error('conversionWorker.ts runs as a worker thread');
// Loading starts now; the setup message waits for it.
const channelPackage = import('@bridgework/channel');
let run: ((job: BlockJob) => BlockDone) | undefined;

const send = (reply: LaneReply): void => {
  port.postMessage(reply);
};

port.on('message', (message: LaneRequest) => {
  if (message.type === 'setup') {
    channelPackage
      .then(({ createChannel, createInterleavedConverter }) => {
        const channels = message.specs.map((spec) =>
          createChannel(spec as Parameters<typeof createChannel>[0]),
        );
        const converter = message.setup.mode === 'frames' ? createInterleavedConverter(channels) : undefined;
        run = createBlockRunner(message.setup, channels, converter);
        send({ type: 'ready' });
      })
      .catch((error: unknown) => {
        send({ type: 'failed', id: undefined, error: sendError(error) });
      });
    return;
  }
  try {
    if (run === undefined) throw new Error('a block came before the conversion lane was set up');
    const { out: _out, ...done } = run(message);
    send({ type: 'done', id: message.id, ...done });
  } catch (error) {
    send({ type: 'failed', id: message.id, error: sendError(error) });
  }
});
