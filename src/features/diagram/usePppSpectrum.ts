// The PPP spectrum of a SMILES string for the side panel, computed in a worker (pppWorker.ts) and
// kept per structure text: null while it is on its way.
import { useEffect, useState } from 'react';
import type { PppAnswer } from './pppWorker.js';

const MAX_KEPT = 200;
const answers = new Map<string, PppAnswer>();
const waiting = new Map<string, Set<() => void>>();
let worker: Worker | null = null;

function workerOnce(): Worker {
  if (worker) return worker;
  worker = new Worker(new URL('./pppWorker.ts', import.meta.url), { type: 'module' });
  worker.onmessage = (event: MessageEvent<PppAnswer>) => {
    const answer = event.data;
    if (answers.size >= MAX_KEPT) answers.clear();
    answers.set(answer.smiles, answer);
    const listeners = waiting.get(answer.smiles);
    waiting.delete(answer.smiles);
    for (const l of listeners ?? []) l();
  };
  worker.onerror = (event) => {
    // A worker that cannot start (or crashed) answers every waiting structure with the reason.
    const problem = `the spectrum could not be computed (${event.message || 'the worker stopped'})`;
    for (const [smiles, listeners] of waiting) {
      answers.set(smiles, { smiles, problem });
      for (const l of listeners) l();
    }
    waiting.clear();
    worker?.terminate();
    worker = null;
  };
  return worker;
}

export function usePppSpectrum(smiles: string): PppAnswer | null {
  const key = smiles.trim();
  const [, rerender] = useState(0);
  const known = answers.get(key) ?? null;
  useEffect(() => {
    if (answers.has(key)) return;
    const wake = () => rerender((n) => n + 1);
    const listeners = waiting.get(key);
    if (listeners) listeners.add(wake);
    else {
      waiting.set(key, new Set([wake]));
      workerOnce().postMessage({ smiles: key });
    }
    return () => {
      waiting.get(key)?.delete(wake);
    };
  }, [key]);
  return known;
}
