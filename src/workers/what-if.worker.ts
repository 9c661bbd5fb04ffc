/**
 * The what-if engine in a Web Worker: only the newest request is worth finishing. A run gives way
 * between slices when a newer request has arrived, and the newer one starts at once.
 */
import { computeWhatIf } from './what-if-compute.ts';
import type { WhatIfRequest, WhatIfResponse } from './what-if-protocol.ts';

const scope = self as unknown as DedicatedWorkerGlobalScope;

let pending: WhatIfRequest | null = null;
let running = false;

// A message-channel round trip yields to the event loop without the 4 ms clamp of nested timers.
const channel = new MessageChannel();
const waiting: (() => void)[] = [];
channel.port1.onmessage = () => waiting.shift()?.();
const yieldToEvents = () =>
  new Promise<void>((resolve) => {
    waiting.push(resolve);
    channel.port2.postMessage(null);
  });

const send = (message: WhatIfResponse) => {
  if (message.type === 'result') {
    const g = message.grid;
    const buffers = [g.depthM, g.thicknessM, g.concentration, g.speed, g.diffusivity, g.depthMeanAlong, g.depthMeanSpeed, g.bedStressPa].map((a) => a.buffer as ArrayBuffer);
    scope.postMessage(message, [...new Set(buffers)]);
  } else {
    scope.postMessage(message);
  }
};

async function drain(): Promise<void> {
  running = true;
  while (pending) {
    const request = pending;
    pending = null;
    const started = performance.now();
    const outcome = await computeWhatIf(
      request.input,
      async () => {
        await yieldToEvents();
        return pending !== null;
      },
      () => performance.now(),
    );
    if (outcome.ok) {
      send({ type: 'result', id: request.id, grid: outcome.grid, windows: outcome.windows, timing: { totalMs: performance.now() - started, modelMs: outcome.modelMs } });
    } else if (outcome.cancelled) {
      send({ type: 'cancelled', id: request.id });
    } else {
      send({ type: 'error', id: request.id, message: outcome.message });
    }
  }
  running = false;
}

scope.onmessage = (event: MessageEvent<WhatIfRequest>) => {
  if (event.data?.type !== 'run') return;
  if (pending) send({ type: 'cancelled', id: pending.id });
  pending = event.data;
  if (!running) void drain();
};
