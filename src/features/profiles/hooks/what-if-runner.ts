import type { ForecastGrid } from '../../../../shared/forecast/grid.ts';
import type { ForecastWindow } from '../../../../shared/forecast/windows.ts';
import type { WhatIfInput, WhatIfRequest, WhatIfResponse, WhatIfTiming } from '../../../workers/what-if-protocol.ts';

export interface WhatIfSnapshot {
  /** A request is out that has not been answered yet. */
  running: boolean;
  result: { id: number; grid: ForecastGrid; windows: ForecastWindow[]; timing: WhatIfTiming } | null;
  error: string | null;
  /** Every finished recompute's whole time, ms, oldest first (the last 50). */
  timings: number[];
  cancelled: number;
}

const EMPTY: WhatIfSnapshot = { running: false, result: null, error: null, timings: [], cancelled: 0 };

/**
 * Owns one what-if worker (created on the first request) and the latest answer, as an external store
 * for useSyncExternalStore. Requests carry increasing ids; the worker answers only the newest.
 */
export class WhatIfRunner {
  private worker: Worker | null = null;
  private nextId = 1;
  private lastSent = 0;
  private snapshot: WhatIfSnapshot = EMPTY;
  private readonly listeners = new Set<() => void>();

  subscribe = (listener: () => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  getSnapshot = () => this.snapshot;

  request(input: WhatIfInput): void {
    if (!this.worker) {
      this.worker = new Worker(new URL('../../../workers/what-if.worker.ts', import.meta.url), { type: 'module', name: 'what-if' });
      this.worker.onmessage = (event: MessageEvent<WhatIfResponse>) => this.receive(event.data);
      this.worker.onerror = (event) => this.update({ running: false, error: event.message || 'The what-if worker failed.' });
    }
    const id = this.nextId++;
    this.lastSent = id;
    const message: WhatIfRequest = { type: 'run', id, input };
    this.worker.postMessage(message);
    this.update({ running: true });
  }

  dispose(): void {
    this.worker?.terminate();
    this.worker = null;
    this.snapshot = EMPTY;
  }

  private receive(message: WhatIfResponse): void {
    const settled = message.id === this.lastSent;
    if (message.type === 'cancelled') {
      this.update({ cancelled: this.snapshot.cancelled + 1 });
    } else if (message.type === 'error') {
      this.update({ running: !settled, error: message.message });
    } else {
      this.update({
        running: !settled,
        error: null,
        result: { id: message.id, grid: message.grid, windows: message.windows, timing: message.timing },
        timings: [...this.snapshot.timings, message.timing.totalMs].slice(-50),
      });
    }
  }

  private update(change: Partial<WhatIfSnapshot>): void {
    this.snapshot = { ...this.snapshot, ...change };
    for (const listener of this.listeners) listener();
  }
}
