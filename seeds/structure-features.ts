// What the demo spectrum generator needs to know about a structure: the
// molecule's atoms with their hydrogens, which single bonds may break and what
// each side of such a bond weighs, and a few group flags. Read from SMILES with
// openchemlib.
import { Molecule } from 'openchemlib';

export type Atoms = Record<string, number>;

const SYMBOL: Record<number, string> = { 1: 'H', 6: 'C', 7: 'N', 8: 'O', 9: 'F', 14: 'Si', 15: 'P', 16: 'S', 17: 'Cl', 35: 'Br', 53: 'I' };

export interface BreakableBond {
  /** Atom kept on the "a" side and its role. */
  a: number;
  b: number;
  /** Composition of the side that holds a, and of the side that holds b. */
  sideA: Atoms;
  sideB: Atoms;
}

export interface StructureFeatures {
  atoms: Atoms;
  /** Heavy atoms are numbered 0 … heavyAtomCount - 1. */
  heavyAtomCount: number;
  bonds: BreakableBond[];
  symbol: (i: number) => string;
  hydrogens: (i: number) => number;
  isAromatic: (i: number) => boolean;
  /** Heavy-atom neighbours of an atom. */
  neighbours: (i: number) => number[];
  /** The neighbour joined by a double bond to oxygen makes i a carbonyl carbon. */
  isCarbonylCarbon: (i: number) => boolean;
  isBenzylic: (i: number) => boolean;
  isNitroNitrogen: (i: number) => boolean;
  aromaticAtoms: number;
  /** Monosubstituted benzene rings (C6H5–). */
  phenylRings: number;
  /** Acyclic sp3 carbons: how much of the molecule is alkyl chain. */
  chainCarbons: number;
  /** Longest run of acyclic sp3 carbons. */
  longestChain: number;
  ringCount: number;
}

function add(target: Atoms, symbol: string, n = 1) {
  target[symbol] = (target[symbol] ?? 0) + n;
}

export function structureFeatures(smiles: string): StructureFeatures {
  const mol = Molecule.fromSmiles(smiles);
  mol.ensureHelperArrays(Molecule.cHelperRings);
  const heavy = mol.getAtoms();
  const symbol = (i: number) => SYMBOL[mol.getAtomicNo(i)] ?? `Z${mol.getAtomicNo(i)}`;
  const hydrogens = (i: number) => mol.getAllHydrogens(i);
  const isAromatic = (i: number) => mol.isAromaticAtom(i);
  const neighbours = (i: number) => {
    const out: number[] = [];
    for (let j = 0; j < mol.getConnAtoms(i); j++) out.push(mol.getConnAtom(i, j));
    return out;
  };
  const isCarbonylCarbon = (i: number) => {
    if (mol.getAtomicNo(i) !== 6) return false;
    for (let j = 0; j < mol.getConnAtoms(i); j++) {
      if (mol.getConnBondOrder(i, j) === 2 && mol.getAtomicNo(mol.getConnAtom(i, j)) === 8) return true;
    }
    return false;
  };
  const isSp3Carbon = (i: number) => mol.getAtomicNo(i) === 6 && mol.getAtomPi(i) === 0 && !mol.isAromaticAtom(i);
  const isBenzylic = (i: number) => isSp3Carbon(i) && neighbours(i).some((n) => mol.isAromaticAtom(n) && mol.getAtomicNo(n) === 6);
  const isNitroNitrogen = (i: number) => mol.getAtomicNo(i) === 7 && neighbours(i).filter((n) => mol.getAtomicNo(n) === 8).length === 2;

  const atoms: Atoms = {};
  for (let i = 0; i < heavy; i++) {
    add(atoms, symbol(i));
    const h = hydrogens(i);
    if (h) add(atoms, 'H', h);
  }

  const sideOf = (start: number, blocked: number): Atoms => {
    const seen = new Set<number>([blocked, start]);
    const stack = [start];
    const out: Atoms = {};
    while (stack.length) {
      const i = stack.pop()!;
      add(out, symbol(i));
      const h = hydrogens(i);
      if (h) add(out, 'H', h);
      for (const n of neighbours(i)) if (!seen.has(n)) { seen.add(n); stack.push(n); }
    }
    return out;
  };

  const bonds: BreakableBond[] = [];
  for (let bond = 0; bond < mol.getBonds(); bond++) {
    if (mol.isRingBond(bond) || mol.getBondOrder(bond) !== 1) continue;
    const a = mol.getBondAtom(0, bond);
    const b = mol.getBondAtom(1, bond);
    bonds.push({ a, b, sideA: sideOf(a, b), sideB: sideOf(b, a) });
  }

  let aromaticAtoms = 0;
  for (let i = 0; i < heavy; i++) if (isAromatic(i)) aromaticAtoms++;
  const rings = mol.getRingSet();
  let phenylRings = 0;
  for (let r = 0; r < rings.getSize(); r++) {
    const ringAtoms = rings.getRingAtoms(r);
    if (ringAtoms.length !== 6 || !ringAtoms.every((i: number) => isAromatic(i) && mol.getAtomicNo(i) === 6)) continue;
    if (ringAtoms.filter((i: number) => hydrogens(i) === 1).length === 5) phenylRings++;
  }
  const chain = (i: number) => isSp3Carbon(i) && !mol.isRingAtom(i);
  let chainCarbons = 0;
  for (let i = 0; i < heavy; i++) if (chain(i)) chainCarbons++;
  // Longest path through chain carbons (trees, so two sweeps of a DFS suffice).
  const farthest = (from: number): [number, number] => {
    let best: [number, number] = [from, 1];
    const walk = (i: number, prev: number, depth: number) => {
      if (depth > best[1]) best = [i, depth];
      for (const n of neighbours(i)) if (n !== prev && chain(n)) walk(n, i, depth + 1);
    };
    walk(from, -1, 1);
    return best;
  };
  let longestChain = 0;
  const visited = new Set<number>();
  for (let i = 0; i < heavy; i++) {
    if (!chain(i) || visited.has(i)) continue;
    const [end] = farthest(i);
    const [, len] = farthest(end);
    longestChain = Math.max(longestChain, len);
    const stack = [i];
    while (stack.length) {
      const k = stack.pop()!;
      if (visited.has(k)) continue;
      visited.add(k);
      for (const n of neighbours(k)) if (chain(n)) stack.push(n);
    }
  }

  return {
    atoms, heavyAtomCount: heavy, bonds, symbol, hydrogens, isAromatic, neighbours, isCarbonylCarbon, isBenzylic, isNitroNitrogen,
    aromaticAtoms, phenylRings, chainCarbons, longestChain, ringCount: rings.getSize(),
  };
}
