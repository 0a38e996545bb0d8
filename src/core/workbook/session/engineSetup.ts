// The engine's one-time set-up (its guards probe a throwaway engine; the function plugin registers the
// catalog) costs as much as a workbook's first build. Run inside that build it made one long task;
// here each step runs in a task of its own, started as the workbook page mounts, and the open waits
// for them (useWorkbookSession.ts).
import { engineSetupSteps } from '@functions/engine.js';

let done = false;
let running: Promise<void> | undefined;

const nextTask = () => new Promise<void>((resolve) => setTimeout(resolve, 0));

export function prepareEngine(): Promise<void> {
  running ??= (async () => {
    for (const step of engineSetupSteps) {
      await nextTask();
      step();
    }
    done = true;
  })();
  return running;
}

export function enginePrepared(): boolean {
  return done;
}
