// The side panel for the selected cell: the MO diagram of the diatomic species it names, or the
// Hückel level ladder of the π system it describes, with the key numbers beside the picture, the
// predicted π→π* bands (PPP-CIS) of a π system, and the known disagreement with experiment of a
// diatomic species where simple MO filling is known to fail.
import { useMemo } from 'react';
import { frontierGap } from '@functions/chem/huckel.js';
import { BORROWED_CENTRE_TYPES } from '@functions/chem/huckelParams.js';
import { knownFailureFor } from '@functions/chem/knownFailures.js';
import type { PppSpectrum } from '@functions/chem/ppp.js';
import { PppSpectrumView } from './PppSpectrumSvg.js';
import { subjectOfCell, type SubjectSource } from './cellSubject.js';
import { HuckelLadderSvg } from './HuckelLadderSvg.js';
import { layoutMoDiagram } from './moLayout.js';
import { MoDiagramSvg } from './MoDiagramSvg.js';
import { EhtLadderView } from './EhtLadderView.js';
import { usePppSpectrum } from './usePppSpectrum.js';

function Fact({ label, value }: { label: string; value: string }) {
  return (
    <div className="flex justify-between gap-3 py-0.5">
      <dt className="text-ink-3">{label}</dt>
      <dd className="text-right font-mono text-ink">{value}</dd>
    </div>
  );
}

const round = (x: number, places = 3) => String(Math.round(x * 10 ** places) / 10 ** places);

export function StructurePanel({ source, address }: { source: SubjectSource | null; address: string }) {
  const subject = useMemo(() => (source ? subjectOfCell(source) : null), [source]);
  if (!source || !subject || subject.kind === 'none') {
    return (
      <div className="p-3 text-ui text-ink-2">
        <p>
          Select a cell that names a diatomic species (O2, NO+, CN-) or a π system in SMILES (c1ccccc1), or a formula using one, to see its levels here.
        </p>
        {/* Only a formula that reads cells is worth a word; a plain text cell is simply not a structure. */}
        {subject?.kind === 'none' && subject.tried.length > 0 && source?.input.startsWith('=') && (
          <p className="mt-2 text-caption text-ink-3">
            {address}: nothing recognisable in {subject.tried.slice(0, 3).map((t) => `“${t}”`).join(', ')}.
          </p>
        )}
      </div>
    );
  }
  if (subject.kind === 'diatomic') {
    const a = subject.analysis;
    const picture = layoutMoDiagram(a);
    const failure = knownFailureFor(a.species);
    return (
      <div className="flex flex-col gap-2 p-3" data-testid="structure-panel">
        <h3 className="text-ui font-semibold">
          MO diagram of <span className="font-mono">{a.species.formula}</span>
        </h3>
        <MoDiagramSvg picture={picture} title={`Molecular orbital diagram of ${a.species.formula}`} />
        <dl className="text-caption">
          <Fact label="Bond order" value={round(a.bondOrder)} />
          <Fact label="Unpaired electrons" value={`${a.unpairedElectrons} (${a.unpairedElectrons > 0 ? 'paramagnetic' : 'diamagnetic'})`} />
          <Fact label="Ground term" value={a.termUnicode} />
          <Fact label="Valence electrons" value={String(a.species.valenceElectrons)} />
          <Fact label="Configuration" value={a.configAbbreviated} />
        </dl>
        {failure && (
          <p className="text-caption text-caution" data-testid="model-caveat">
            Experiment: {failure.experimentalTerm} (Huber &amp; Herzberg 1979) — {failure.note}.
          </p>
        )}
        <p className="text-caption text-ink-3">Qualitative level order (spacing not to scale); atoms drawn neutral{a.species.charge !== 0 ? `, the molecule carries charge ${a.species.charge > 0 ? '+' : ''}${a.species.charge}` : ''}.</p>
      </div>
    );
  }
  if (subject.kind === 'eht') {
    const name = subject.structure.includes('\n') || subject.structure.length > 40 ? `${subject.structure.split('\n')[0].slice(0, 40)}…` : subject.structure;
    const s = subject.summary;
    return (
      <div className="flex flex-col gap-2 p-3" data-testid="structure-panel">
        <h3 className="text-ui font-semibold">
          Extended-Hückel levels of <span className="font-mono">{name}</span>
        </h3>
        {s === 'pending' ? (
          <p className="text-caption text-ink-3">computing… the server is working on this structure; the ladder appears when it is ready.</p>
        ) : (
          <>
            <EhtLadderView summary={s} title={`Extended-Hückel levels of ${name}`} />
            <dl className="text-caption">
              <Fact label="Atoms" value={`${s.atoms} (${s.source === 'smiles-conformer' ? 'generated conformer' : s.source === 'xyz' ? 'XYZ as given' : 'molfile as given'})`} />
              <Fact label="Levels" value={String(s.levels.length)} />
              {'homoEv' in s.frontier && <Fact label="HOMO–LUMO gap" value={`${round(s.frontier.lumoEv - s.frontier.homoEv, 2)} eV`} />}
            </dl>
            <p className="text-caption text-ink-3">One-electron levels, no self-consistency: energies are qualitative, charges exaggerated (docs/eht.md).</p>
          </>
        )}
      </div>
    );
  }
  const model = subject.model;
  const borrowed = subject.parameterSet === 'streitwieser' && (model.pi?.centres ?? []).some((c) => c.type && BORROWED_CENTRE_TYPES.includes(c.type));
  let gap = '—';
  try {
    const f = frontierGap(model, model.electrons);
    gap = f.openShellDegenerate ? '0 (open-shell degenerate HOMO)' : `${round(f.gap)} |β|`;
  } catch (e) {
    gap = (e as Error).message;
  }
  return (
    <div className="flex flex-col gap-2 p-3" data-testid="structure-panel">
      <h3 className="text-ui font-semibold">
        Hückel π levels of <span className="font-mono">{subject.smiles}</span>
      </h3>
      <HuckelLadderSvg model={model} electrons={model.electrons} title={`Hückel π levels of ${subject.smiles}`} />
      <dl className="text-caption">
        <Fact label="π centres" value={String(model.levels.length)} />
        <Fact label="π electrons" value={String(model.electrons)} />
        <Fact label="HOMO–LUMO gap" value={gap} />
        <Fact label="Heteroatom parameters" value={subject.parameterSet} />
      </dl>
      {borrowed && (
        <p className="text-caption text-ink-3" data-testid="parameter-note">
          Streitwieser&apos;s table has no S or P; their values here come from Van-Catledge (J. Org. Chem. 1980).
        </p>
      )}
      <PppBands smiles={subject.smiles} />
    </div>
  );
}

/** The predicted bands, computed off the page's thread (usePppSpectrum). */
function PppBands({ smiles }: { smiles: string }) {
  const answer = usePppSpectrum(smiles);
  const spectrum = answer && 'singlets' in answer ? answer : null;
  const strongest = spectrum?.singlets.filter((s) => s.wavelength > 200).reduce<PppSpectrum['singlets'][number] | null>((b, s) => (!b || s.f > b.f ? s : b), null);
  return (
    <>
      <h4 className="text-caption font-semibold">Predicted π→π* bands (PPP-CIS, a model estimate)</h4>
      {spectrum ? (
        <>
          <PppSpectrumView states={spectrum.singlets} title={`Predicted π→π* bands of ${smiles}`} />
          <dl className="text-caption">
            <Fact label="S1" value={`${Math.round(spectrum.singlets[0].wavelength)} nm, ${round(spectrum.singlets[0].energy, 2)} eV, f ${round(spectrum.singlets[0].f, 3)}`} />
            {strongest && <Fact label="Strongest above 200 nm" value={`${Math.round(strongest.wavelength)} nm, f ${round(strongest.f, 2)}`} />}
            <Fact label="T1" value={`${round(spectrum.triplets[0], 2)} eV`} />
          </dl>
        </>
      ) : (
        <p className="text-caption text-ink-3" data-testid="ppp-status">{answer && 'problem' in answer ? answer.problem : 'computing the predicted bands…'}</p>
      )}
    </>
  );
}
