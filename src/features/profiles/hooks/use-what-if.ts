import { useEffect, useState, useSyncExternalStore } from 'react';
import type { WhatIfInput } from '../../../workers/what-if-protocol.ts';
import { WhatIfRunner } from './what-if-runner.ts';

/**
 * Recomputes a what-if in a Web Worker whenever `input` changes (pass a memoised value); stale runs
 * are dropped by the worker. Each caller gets its own worker, so two panes compute side by side.
 */
export function useWhatIf(input: WhatIfInput | null) {
  const [runner] = useState(() => new WhatIfRunner());
  const snapshot = useSyncExternalStore(runner.subscribe, runner.getSnapshot);
  useEffect(() => {
    if (input) runner.request(input);
  }, [runner, input]);
  useEffect(() => () => runner.dispose(), [runner]);
  return snapshot;
}
