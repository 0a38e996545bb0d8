// Computes PPP-CIS spectra for the side panel off the page's thread: the spectrum needs a 2D drawing
// of the molecule, and the first drawing makes the chemistry library set itself up for a second or
// more, which on the page would freeze the grid right after a paste or a click.
// The chemistry modules wait (a top-level await) for openchemlib to load; they are imported here
// without waiting, so the message handler is in place at once and no early ask is lost.
import type { pppSpectrumOf } from '@functions/chem/ppp.js';

export interface PppAsk {
  smiles: string;
}
export type PppAnswer = { smiles: string; singlets: ReturnType<typeof pppSpectrumOf>['singlets']; triplets: number[] } | { smiles: string; problem: string };

const chemistry = import('@functions/chem/ppp.js');

self.onmessage = async (event: MessageEvent<PppAsk>) => {
  const { smiles } = event.data;
  let answer: PppAnswer;
  try {
    const spectrum = (await chemistry).pppSpectrumOf(smiles);
    answer = { smiles, singlets: spectrum.singlets, triplets: spectrum.triplets };
  } catch (e) {
    answer = { smiles, problem: e instanceof Error ? e.message : String(e) };
  }
  self.postMessage(answer);
};
