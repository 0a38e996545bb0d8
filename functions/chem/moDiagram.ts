// Valence molecular-orbital diagrams of diatomic species, in energy order. Which diagram applies,
// and in which order its levels lie, is decided here; filling them is diatomic.ts's job.
//
// Diagrams (qualitative LCAO, as in Atkins & de Paula, Physical Chemistry, ch. "Molecular structure"):
//  - one-s: H and He only. σ(1s) and σ*(1s) from the two 1s orbitals (H2, H2+, He2, HeH+).
//  - hydride: H with Li…Ar. Only the partner's σ orbitals (ns, np_z) meet H 1s: one bonding σ,
//    one non-bonding σ lone pair, the partner's np_x,y as a non-bonding π pair, and one σ*.
//    Below the π pair the two σ levels are both filled in every neutral hydride from BH on, so the
//    bond order does not depend on which of them is called bonding; we call the lower one bonding
//    for Li…B, Na…Al (H 1s meets a high-lying valence s/p), and the partner's s lone pair for
//    C…Ne, Si…Ar, where ns lies far below H 1s (Atkins' treatment of HF: 1π non-bonding).
//    Ground terms this gives match Huber & Herzberg (1979): LiH ¹Σ⁺, BeH ²Σ⁺, BH ¹Σ⁺, CH ²Π,
//    NH ³Σ⁻, OH ²Π, HF ¹Σ⁺.
//  - sp: both atoms from periods 2–3 (valence ns, np over a [He] or [Ne] core): σ(s), σ*(s), π(p),
//    σ(p), π*(p), σ*(p). The order of π(p) and σ(p) depends on s–p mixing:
//      mixed   (π(p) below σ(p)): strong 2s–2p mixing, Li2…N2 (photoelectron spectrum of N2:
//              HOMO 3σg; Turner et al., Molecular Photoelectron Spectroscopy, 1970), CO (HOMO 5σ);
//      unmixed (σ(p) below π(p)): O2, F2, where the 2s–2p gap is large.
//    auto: mixed for species with 10 or fewer valence electrons (B2…N2 and isoelectronic or lighter
//    species such as CO, CN⁻, NO⁺, N2⁺, C2²⁻), unmixed from 11 on (O2⁺, NO, O2, F2…). Where both
//    orders fill the same levels (e.g. N2⁻) the choice changes only the listing order.
//    Third-row atoms use n = 3 shells over a neon core; the same rule is applied to them without
//    evidence that it holds there (the 10-electron boundary comes from second-row photoelectron
//    spectra): Si2 (³Σg⁻) and Al2 (³Πu) come out wrong with it, and P2's HOMO is πu, not σg
//    (knownFailures.ts lists these and the other known disagreements).
//
// Labels: homonuclear species carry g/u parity and * for antibonding, with the parent atomic
// orbitals: σg(2s), σu*(2s), πu(2p), σg(2p), πg*(2p), σu*(2p). Heteronuclear species have no
// inversion centre, so their orbitals are numbered by symmetry in energy order counting the core
// (Mulliken's numbering, used by Huber & Herzberg 1979: CO … 5σ² with 2π the LUMO), with * added to
// antibonding levels (our addition, so the table reads at a glance): 3σ, 4σ*, 1π, 5σ, 2π*, 6σ*.
// Core shells are abbreviated K (1s²) and L (2s² 2p⁶) per atom, as Herzberg writes "KK" for N2.
import { ChemError } from './errors.js';
import type { Element } from './elements.js';
import type { Species } from './species.js';
import { superscriptNumber } from './terms.js';

export type OrderingChoice = 'auto' | 'mixed' | 'unmixed';
export type DiagramKind = 'one-s' | 'hydride' | 'sp-mixed' | 'sp-unmixed';
export type BondCharacter = 'bonding' | 'antibonding' | 'nonbonding';

export interface MoLevel {
  label: string;
  /** |λ|: 0 for σ, 1 for π. */
  lambda: 0 | 1;
  character: BondCharacter;
  /** 2 for σ, 4 for a π pair. */
  capacity: 2 | 4;
  parity?: 'g' | 'u';
}

export interface MoDiagram {
  kind: DiagramKind;
  /** Valence levels, lowest energy first. */
  levels: MoLevel[];
  /** "KK", "KK LL", "K", "KK L" or "" (no core). */
  coreAbbreviation: string;
  /** The filled core orbitals written out, e.g. "σg(1s)² σu*(1s)²". */
  coreFull: string;
}

/** Most valence levels any diagram has (the sp diagram): MOTABLE pads to this many rows. */
export const MAX_VALENCE_LEVELS = 6;

export const ORDERINGS: OrderingChoice[] = ['auto', 'mixed', 'unmixed'];

/** Valence electron count up to which `auto` takes the s–p mixed order (see the header). */
export const MIXED_ORDER_MAX_VALENCE_ELECTRONS = 10;

type SpRole = 'σs' | 'σs*' | 'πp' | 'σp' | 'πp*' | 'σp*';
const MIXED: SpRole[] = ['σs', 'σs*', 'πp', 'σp', 'πp*', 'σp*'];
const UNMIXED: SpRole[] = ['σs', 'σs*', 'σp', 'πp', 'πp*', 'σp*'];

const HOMONUCLEAR_SP: Record<SpRole, { name: string; parity: 'g' | 'u'; lambda: 0 | 1; character: BondCharacter; shell: 's' | 'p' }> = {
  'σs': { name: 'σg', parity: 'g', lambda: 0, character: 'bonding', shell: 's' },
  'σs*': { name: 'σu*', parity: 'u', lambda: 0, character: 'antibonding', shell: 's' },
  'πp': { name: 'πu', parity: 'u', lambda: 1, character: 'bonding', shell: 'p' },
  'σp': { name: 'σg', parity: 'g', lambda: 0, character: 'bonding', shell: 'p' },
  'πp*': { name: 'πg*', parity: 'g', lambda: 1, character: 'antibonding', shell: 'p' },
  'σp*': { name: 'σu*', parity: 'u', lambda: 0, character: 'antibonding', shell: 'p' },
};

function level(label: string, lambda: 0 | 1, character: BondCharacter, parity?: 'g' | 'u'): MoLevel {
  const l: MoLevel = { label, lambda, character, capacity: lambda === 0 ? 2 : 4 };
  if (parity) l.parity = parity;
  return l;
}

function homonuclearSpLevels(n: number, roles: SpRole[]): MoLevel[] {
  return roles.map((r) => {
    const o = HOMONUCLEAR_SP[r];
    return level(`${o.name}(${n}${o.shell})`, o.lambda, o.character, o.parity);
  });
}

/** Mulliken numbering: σ and π levels counted separately, from the lowest (core) orbital up. */
function numberedLevels(spec: { lambda: 0 | 1; character: BondCharacter }[], coreSigma: number, corePi: number): MoLevel[] {
  let sigma = coreSigma;
  let pi = corePi;
  return spec.map(({ lambda, character }) => {
    const index = lambda === 0 ? ++sigma : ++pi;
    return level(`${index}${lambda === 0 ? 'σ' : 'π'}${character === 'antibonding' ? '*' : ''}`, lambda, character);
  });
}

function spRoleSpec(role: SpRole) {
  const o = HOMONUCLEAR_SP[role];
  return { lambda: o.lambda, character: o.character };
}

function coreOf(atoms: Element[], homonuclear: boolean) {
  const shells = atoms.flatMap((a) => a.coreShells);
  const k = shells.filter((s) => s === 'K').length;
  const l = shells.filter((s) => s === 'L').length;
  const abbreviation = ['K'.repeat(k), 'L'.repeat(l)].filter(Boolean).join(' ');
  const filled = (lv: MoLevel) => `${lv.label}${superscriptNumber(lv.capacity)}`;
  if (homonuclear) {
    const levels = [
      ...(k ? homonuclearSpLevels(1, ['σs', 'σs*']) : []),
      ...(l ? homonuclearSpLevels(2, UNMIXED) : []),
    ];
    return { abbreviation, full: levels.map(filled).join(' '), coreSigma: 0, corePi: 0 };
  }
  const coreSigma = k + 2 * l;
  const corePi = l;
  const full = [
    ...Array.from({ length: coreSigma }, (_, i) => `${i + 1}σ²`),
    ...Array.from({ length: corePi }, (_, i) => `${i + 1}π⁴`),
  ].join(' ');
  return { abbreviation, full, coreSigma, corePi };
}

function rejectUnsupportedPair(species: Species): void {
  const [a, b] = species.atoms;
  if (species.homonuclear) return;
  const helium = a.symbol === 'He' ? a : b.symbol === 'He' ? b : undefined;
  const other = helium === a ? b : a;
  if (helium && other.period > 1) {
    throw new ChemError(`'${species.text}' pairs helium with ${other.name}: this model bonds helium only to H or He`);
  }
  if (a.period > 1 && b.period > 1 && a.isSBlockMetal !== b.isSBlockMetal) {
    const metal = a.isSBlockMetal ? a : b;
    const partner = metal === a ? b : a;
    throw new ChemError(
      `'${species.text}' pairs ${metal.name} (an s-block metal) with ${partner.name}: such largely ionic pairs are outside this covalent MO model`,
    );
  }
}

/** Resolves `auto` by the rule in the header; hydride and 1s diagrams have no s–p ordering to choose. */
export function resolveDiagramKind(species: Species, ordering: OrderingChoice): DiagramKind {
  rejectUnsupportedPair(species);
  const [a, b] = species.atoms;
  if (a.period === 1 && b.period === 1) return 'one-s';
  if (a.symbol === 'H' || b.symbol === 'H') return 'hydride';
  if (ordering === 'mixed') return 'sp-mixed';
  if (ordering === 'unmixed') return 'sp-unmixed';
  return species.valenceElectrons <= MIXED_ORDER_MAX_VALENCE_ELECTRONS ? 'sp-mixed' : 'sp-unmixed';
}

export function buildDiagram(species: Species, ordering: OrderingChoice): MoDiagram {
  const kind = resolveDiagramKind(species, ordering);
  const [a, b] = species.atoms;
  const core = coreOf(species.atoms, species.homonuclear);
  let levels: MoLevel[];
  if (kind === 'one-s') {
    levels = species.homonuclear
      ? homonuclearSpLevels(1, ['σs', 'σs*'])
      : numberedLevels([spRoleSpec('σs'), spRoleSpec('σs*')], 0, 0);
  } else if (kind === 'hydride') {
    const partner = a.symbol === 'H' ? b : a;
    const earlyPartner = partner.valenceElectrons <= 3;
    levels = numberedLevels(
      [
        { lambda: 0, character: earlyPartner ? 'bonding' : 'nonbonding' },
        { lambda: 0, character: earlyPartner ? 'nonbonding' : 'bonding' },
        { lambda: 1, character: 'nonbonding' },
        { lambda: 0, character: 'antibonding' },
      ],
      core.coreSigma,
      core.corePi,
    );
  } else {
    const roles = kind === 'sp-mixed' ? MIXED : UNMIXED;
    levels = species.homonuclear
      ? homonuclearSpLevels(a.period, roles)
      : numberedLevels(roles.map(spRoleSpec), core.coreSigma, core.corePi);
  }
  return { kind, levels, coreAbbreviation: core.abbreviation, coreFull: core.full };
}
