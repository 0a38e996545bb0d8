// Computes PPP-CIS spectra for the side panel off the page's thread: the spectrum needs a 2D drawing
// of the molecule, and the first drawing makes the chemistry library set itself up for a second or
// more, which on the page would freeze the grid right after a paste or a click.
import { pppSpectrumOf } from '@functions/chem/ppp.js';

export interface PppAsk {
  smiles: string;
}
export type PppAnswer = { smiles: string; singlets: ReturnType<typeof pppSpectrumOf>['singlets']; triplets: number[] } | { smiles: string; problem: string };

self.onmessage = (event: MessageEvent<PppAsk>) => {
  const { smiles } = event.data;
  let answer: PppAnswer;
  try {
    const spectrum = pppSpectrumOf(smiles);
    answer = { smiles, singlets: spectrum.singlets, triplets: spectrum.triplets };
  } catch (e) {
    answer = { smiles, problem: e instanceof Error ? e.message : String(e) };
  }
  self.postMessage(answer);
};
