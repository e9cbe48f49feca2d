// The compounds of the demo scenario: real names, formulas and structures.
// Their spectra are made up by seeds/synthetic-spectrum.ts, and the retention
// indices below are plausible round values for a non-polar phase invented for
// the demo (the n-alkanes are 100·n by the definition of the index); neither
// is for identification. Registry numbers are given only where they were
// known with confidence (from memory; each passes its check digit, see
// tests/unit/seeds); otherwise they are left out.

export type CompoundClass =
  | 'alkane'
  | 'alkene'
  | 'cycloalkane'
  | 'aromatic'
  | 'alcohol'
  | 'phenol'
  | 'ketone'
  | 'aldehyde'
  | 'acid'
  | 'ester'
  | 'ether'
  | 'amine'
  | 'amide'
  | 'nitrile'
  | 'nitro'
  | 'N-heterocycle'
  | 'O-heterocycle'
  | 'sulfur'
  | 'halogenated'
  | 'fluorinated'
  | 'organosilicon'
  | 'TMS derivative';

export interface DemoCompound {
  name: string;
  /** Molecular formula as usually written; the seed stores it in Hill order. */
  formula: string;
  smiles: string;
  cls: CompoundClass;
  /** Retention index on a non-polar phase: synthetic demo value (n-alkanes: 100·n). */
  ri?: number;
  cas?: string;
  synonyms?: string[];
  /** Tags beyond the class tag (e.g. 'solvent', 'RI ladder'). */
  tags?: string[];
  /** 'absent': the generator leaves the molecular ion out, as EI often does for such compounds. */
  molecularIon?: 'absent';
  derivative?: string;
  parentCompound?: string;
}

type Extra = Omit<DemoCompound, 'name' | 'formula' | 'smiles' | 'cls'>;
const c = (name: string, formula: string, smiles: string, cls: CompoundClass, extra: Extra = {}): DemoCompound => ({
  name,
  formula,
  smiles,
  cls,
  ...extra,
});

const N_ALKANE_CAS: Record<number, string> = {
  6: '110-54-3', 7: '142-82-5', 8: '111-65-9', 9: '111-84-2', 10: '124-18-5', 11: '1120-21-4', 12: '112-40-3',
  13: '629-50-5', 14: '629-59-4', 15: '629-62-9', 16: '544-76-3', 17: '629-78-7', 18: '593-45-3', 19: '629-92-5', 20: '112-95-8',
};
const N_ALKANE_NAMES = ['', '', '', '', '', '', 'Hexane', 'Heptane', 'Octane', 'Nonane', 'Decane', 'Undecane', 'Dodecane', 'Tridecane',
  'Tetradecane', 'Pentadecane', 'Hexadecane', 'Heptadecane', 'Octadecane', 'Nonadecane', 'Eicosane'];

/** n-Alkanes C6–C20: the retention-index ladder. */
const nAlkanes: DemoCompound[] = [];
for (let n = 6; n <= 20; n++) {
  nAlkanes.push(c(N_ALKANE_NAMES[n], `C${n}H${2 * n + 2}`, 'C'.repeat(n), 'alkane', {
    ri: 100 * n,
    cas: N_ALKANE_CAS[n],
    synonyms: [`n-${N_ALKANE_NAMES[n].toLowerCase()}`],
    tags: ['RI ladder', ...(n <= 7 ? ['solvent'] : [])],
  }));
}

export const DEMO_COMPOUNDS: DemoCompound[] = [
  // ---- hydrocarbons: alkanes
  c('Pentane', 'C5H12', 'CCCCC', 'alkane', { ri: 500, tags: ['solvent'] }),
  ...nAlkanes,
  c('2-Methylpentane', 'C6H14', 'CC(C)CCC', 'alkane', { ri: 570, synonyms: ['isohexane'] }),
  c('3-Methylpentane', 'C6H14', 'CCC(C)CC', 'alkane', { ri: 584 }),
  c('2,2-Dimethylbutane', 'C6H14', 'CC(C)(C)CC', 'alkane', { ri: 537, synonyms: ['neohexane'] }),
  c('2,3-Dimethylbutane', 'C6H14', 'CC(C)C(C)C', 'alkane', { ri: 567 }),
  c('2-Methylhexane', 'C7H16', 'CC(C)CCCC', 'alkane', { ri: 667 }),
  c('3-Methylhexane', 'C7H16', 'CCC(C)CCC', 'alkane', { ri: 676 }),
  c('2,2,4-Trimethylpentane', 'C8H18', 'CC(C)CC(C)(C)C', 'alkane', { ri: 690, cas: '540-84-1', synonyms: ['isooctane'], tags: ['solvent'] }),
  c('2-Methylheptane', 'C8H18', 'CC(C)CCCCC', 'alkane', { ri: 765 }),
  c('Pristane', 'C19H40', 'CC(C)CCCC(C)CCCC(C)CCCC(C)C', 'alkane', { ri: 1707, synonyms: ['2,6,10,14-tetramethylpentadecane'] }),
  c('Phytane', 'C20H42', 'CC(C)CCCC(C)CCCC(C)CCCC(C)CC', 'alkane', { ri: 1811, synonyms: ['2,6,10,14-tetramethylhexadecane'] }),
  // ---- alkenes (terpenes included)
  c('1-Hexene', 'C6H12', 'C=CCCCC', 'alkene', { ri: 590 }),
  c('(E)-2-Hexene', 'C6H12', 'C/C=C/CCC', 'alkene', { ri: 602, synonyms: ['trans-2-hexene'] }),
  c('1-Octene', 'C8H16', 'C=CCCCCCC', 'alkene', { ri: 790 }),
  c('1-Decene', 'C10H20', 'C=CCCCCCCCC', 'alkene', { ri: 990 }),
  c('1-Dodecene', 'C12H24', 'C=CCCCCCCCCCC', 'alkene', { ri: 1190 }),
  c('1-Tetradecene', 'C14H28', 'C=CCCCCCCCCCCCC', 'alkene', { ri: 1390 }),
  c('Cyclohexene', 'C6H10', 'C1CC=CCC1', 'alkene', { ri: 690 }),
  c('Isoprene', 'C5H8', 'CC(=C)C=C', 'alkene', { ri: 512, synonyms: ['2-methyl-1,3-butadiene'] }),
  c('Limonene', 'C10H16', 'CC1=CCC(CC1)C(=C)C', 'alkene', { ri: 1030, synonyms: ['p-mentha-1,8-diene'] }),
  c('alpha-Pinene', 'C10H16', 'CC1=CCC2CC1C2(C)C', 'alkene', { ri: 935 }),
  c('beta-Pinene', 'C10H16', 'CC1(C)C2CCC(=C)C1C2', 'alkene', { ri: 978 }),
  // ---- cycloalkanes
  c('Cyclopentane', 'C5H10', 'C1CCCC1', 'cycloalkane', { ri: 565 }),
  c('Methylcyclopentane', 'C6H12', 'CC1CCCC1', 'cycloalkane', { ri: 625 }),
  c('Cyclohexane', 'C6H12', 'C1CCCCC1', 'cycloalkane', { ri: 660, cas: '110-82-7', tags: ['solvent'] }),
  c('Methylcyclohexane', 'C7H14', 'CC1CCCCC1', 'cycloalkane', { ri: 720 }),
  c('Cycloheptane', 'C7H14', 'C1CCCCCC1', 'cycloalkane', { ri: 785 }),
  c('Ethylcyclohexane', 'C8H16', 'CCC1CCCCC1', 'cycloalkane', { ri: 830 }),
  c('Cyclooctane', 'C8H16', 'C1CCCCCCC1', 'cycloalkane', { ri: 890 }),
  c('Propylcyclohexane', 'C9H18', 'CCCC1CCCCC1', 'cycloalkane', { ri: 928 }),
  c('Decahydronaphthalene', 'C10H18', 'C1CCC2CCCCC2C1', 'cycloalkane', { ri: 1057, synonyms: ['decalin'] }),
  // ---- aromatics
  c('Benzene', 'C6H6', 'c1ccccc1', 'aromatic', { ri: 655, cas: '71-43-2', tags: ['solvent'] }),
  c('Toluene', 'C7H8', 'Cc1ccccc1', 'aromatic', { ri: 760, cas: '108-88-3', synonyms: ['methylbenzene'], tags: ['solvent'] }),
  c('Ethylbenzene', 'C8H10', 'CCc1ccccc1', 'aromatic', { ri: 855, cas: '100-41-4' }),
  c('p-Xylene', 'C8H10', 'Cc1ccc(C)cc1', 'aromatic', { ri: 865, cas: '106-42-3', synonyms: ['1,4-dimethylbenzene'], tags: ['solvent'] }),
  c('m-Xylene', 'C8H10', 'Cc1cccc(C)c1', 'aromatic', { ri: 866, cas: '108-38-3', synonyms: ['1,3-dimethylbenzene'], tags: ['solvent'] }),
  c('o-Xylene', 'C8H10', 'Cc1ccccc1C', 'aromatic', { ri: 887, cas: '95-47-6', synonyms: ['1,2-dimethylbenzene'], tags: ['solvent'] }),
  c('Styrene', 'C8H8', 'C=Cc1ccccc1', 'aromatic', { ri: 883, cas: '100-42-5', synonyms: ['vinylbenzene'] }),
  c('Isopropylbenzene', 'C9H12', 'CC(C)c1ccccc1', 'aromatic', { ri: 923, synonyms: ['cumene'] }),
  c('Propylbenzene', 'C9H12', 'CCCc1ccccc1', 'aromatic', { ri: 952 }),
  c('1,3,5-Trimethylbenzene', 'C9H12', 'Cc1cc(C)cc(C)c1', 'aromatic', { ri: 965, synonyms: ['mesitylene'] }),
  c('1,2,4-Trimethylbenzene', 'C9H12', 'Cc1ccc(C)c(C)c1', 'aromatic', { ri: 990, synonyms: ['pseudocumene'] }),
  c('tert-Butylbenzene', 'C10H14', 'CC(C)(C)c1ccccc1', 'aromatic', { ri: 990 }),
  c('p-Cymene', 'C10H14', 'CC(C)c1ccc(C)cc1', 'aromatic', { ri: 1024, synonyms: ['4-isopropyltoluene'] }),
  c('Butylbenzene', 'C10H14', 'CCCCc1ccccc1', 'aromatic', { ri: 1055 }),
  c('Indane', 'C9H10', 'C1Cc2ccccc2C1', 'aromatic', { ri: 1035, synonyms: ['2,3-dihydro-1H-indene'] }),
  c('Tetralin', 'C10H12', 'C1CCc2ccccc2C1', 'aromatic', { ri: 1160, synonyms: ['1,2,3,4-tetrahydronaphthalene'] }),
  c('Naphthalene', 'C10H8', 'c1ccc2ccccc2c1', 'aromatic', { ri: 1180, cas: '91-20-3' }),
  c('1-Methylnaphthalene', 'C11H10', 'Cc1cccc2ccccc12', 'aromatic', { ri: 1300 }),
  c('2-Methylnaphthalene', 'C11H10', 'Cc1ccc2ccccc2c1', 'aromatic', { ri: 1290 }),
  c('Biphenyl', 'C12H10', 'c1ccc(cc1)-c1ccccc1', 'aromatic', { ri: 1380, cas: '92-52-4' }),
  c('Acenaphthene', 'C12H10', 'C1Cc2cccc3cccc1c23', 'aromatic', { ri: 1465 }),
  c('Diphenylmethane', 'C13H12', 'C(c1ccccc1)c1ccccc1', 'aromatic', { ri: 1500 }),
  c('Fluorene', 'C13H10', 'C1c2ccccc2-c2ccccc12', 'aromatic', { ri: 1585 }),
  c('Phenanthrene', 'C14H10', 'c1ccc2c(c1)ccc1ccccc12', 'aromatic', { ri: 1775, cas: '85-01-8' }),
  c('Anthracene', 'C14H10', 'c1ccc2cc3ccccc3cc2c1', 'aromatic', { ri: 1780, cas: '120-12-7' }),
  c('Pyrene', 'C16H10', 'c1cc2ccc3cccc4ccc(c1)c2c34', 'aromatic', { ri: 2090 }),
  // ---- alcohols
  c('Methanol', 'CH4O', 'CO', 'alcohol', { cas: '67-56-1', tags: ['solvent'] }),
  c('Ethanol', 'C2H6O', 'CCO', 'alcohol', { cas: '64-17-5', tags: ['solvent'] }),
  c('1-Propanol', 'C3H8O', 'CCCO', 'alcohol', { ri: 550, tags: ['solvent'] }),
  c('2-Propanol', 'C3H8O', 'CC(C)O', 'alcohol', { ri: 490, cas: '67-63-0', synonyms: ['isopropanol'], tags: ['solvent'] }),
  c('1-Butanol', 'C4H10O', 'CCCCO', 'alcohol', { ri: 660, cas: '71-36-3', synonyms: ['n-butanol'], tags: ['solvent'] }),
  c('2-Butanol', 'C4H10O', 'CCC(C)O', 'alcohol', { ri: 600 }),
  c('2-Methyl-1-propanol', 'C4H10O', 'CC(C)CO', 'alcohol', { ri: 620, synonyms: ['isobutanol'] }),
  c('tert-Butanol', 'C4H10O', 'CC(C)(C)O', 'alcohol', { ri: 515, synonyms: ['2-methyl-2-propanol'], molecularIon: 'absent' }),
  c('2-Methyl-2-butanol', 'C5H12O', 'CCC(C)(C)O', 'alcohol', { ri: 640, synonyms: ['tert-amyl alcohol'], molecularIon: 'absent' }),
  c('1-Pentanol', 'C5H12O', 'CCCCCO', 'alcohol', { ri: 765 }),
  c('1-Hexanol', 'C6H14O', 'CCCCCCO', 'alcohol', { ri: 868 }),
  c('Cyclohexanol', 'C6H12O', 'OC1CCCCC1', 'alcohol', { ri: 880 }),
  c('1-Octanol', 'C8H18O', 'CCCCCCCCO', 'alcohol', { ri: 1070 }),
  c('2-Ethyl-1-hexanol', 'C8H18O', 'CCCCC(CC)CO', 'alcohol', { ri: 1030 }),
  c('1-Decanol', 'C10H22O', 'CCCCCCCCCCO', 'alcohol', { ri: 1272 }),
  c('Benzyl alcohol', 'C7H8O', 'OCc1ccccc1', 'alcohol', { ri: 1036, synonyms: ['phenylmethanol'] }),
  c('2-Phenylethanol', 'C8H10O', 'OCCc1ccccc1', 'alcohol', { ri: 1115 }),
  c('Linalool', 'C10H18O', 'CC(C)=CCCC(C)(O)C=C', 'alcohol', { ri: 1100, molecularIon: 'absent' }),
  c('Menthol', 'C10H20O', 'CC(C)C1CCC(C)CC1O', 'alcohol', { ri: 1175 }),
  c('Ethylene glycol', 'C2H6O2', 'OCCO', 'alcohol', { ri: 710, synonyms: ['1,2-ethanediol'] }),
  // ---- phenols
  c('Phenol', 'C6H6O', 'Oc1ccccc1', 'phenol', { ri: 980, cas: '108-95-2' }),
  c('o-Cresol', 'C7H8O', 'Cc1ccccc1O', 'phenol', { ri: 1055, synonyms: ['2-methylphenol'] }),
  c('m-Cresol', 'C7H8O', 'Cc1cccc(O)c1', 'phenol', { ri: 1078, synonyms: ['3-methylphenol'] }),
  c('p-Cresol', 'C7H8O', 'Cc1ccc(O)cc1', 'phenol', { ri: 1075, synonyms: ['4-methylphenol'] }),
  c('2,4-Dimethylphenol', 'C8H10O', 'Cc1ccc(O)c(C)c1', 'phenol', { ri: 1150 }),
  c('Guaiacol', 'C7H8O2', 'COc1ccccc1O', 'phenol', { ri: 1090, synonyms: ['2-methoxyphenol'] }),
  c('Eugenol', 'C10H12O2', 'COc1cc(CC=C)ccc1O', 'phenol', { ri: 1358 }),
  c('Thymol', 'C10H14O', 'Cc1ccc(C(C)C)c(O)c1', 'phenol', { ri: 1290 }),
  c('4-tert-Butylphenol', 'C10H14O', 'CC(C)(C)c1ccc(O)cc1', 'phenol', { ri: 1250 }),
  c('2,6-Di-tert-butyl-4-methylphenol', 'C15H24O', 'Cc1cc(C(C)(C)C)c(O)c(C(C)(C)C)c1', 'phenol', { ri: 1510, synonyms: ['BHT', 'butylated hydroxytoluene'] }),
  // ---- ketones
  c('Acetone', 'C3H6O', 'CC(C)=O', 'ketone', { ri: 500, cas: '67-64-1', synonyms: ['propanone'], tags: ['solvent'] }),
  c('2-Butanone', 'C4H8O', 'CCC(C)=O', 'ketone', { ri: 600, cas: '78-93-3', synonyms: ['methyl ethyl ketone'], tags: ['solvent'] }),
  c('2,3-Butanedione', 'C4H6O2', 'CC(=O)C(C)=O', 'ketone', { ri: 590, synonyms: ['diacetyl'] }),
  c('2-Pentanone', 'C5H10O', 'CCCC(C)=O', 'ketone', { ri: 685 }),
  c('3-Pentanone', 'C5H10O', 'CCC(=O)CC', 'ketone', { ri: 700, synonyms: ['diethyl ketone'] }),
  c('Cyclopentanone', 'C5H8O', 'O=C1CCCC1', 'ketone', { ri: 790 }),
  c('4-Methyl-2-pentanone', 'C6H12O', 'CC(C)CC(C)=O', 'ketone', { ri: 735, synonyms: ['methyl isobutyl ketone'], tags: ['solvent'] }),
  c('2-Hexanone', 'C6H12O', 'CCCCC(C)=O', 'ketone', { ri: 790 }),
  c('Cyclohexanone', 'C6H10O', 'O=C1CCCCC1', 'ketone', { ri: 895, cas: '108-94-1' }),
  c('2-Heptanone', 'C7H14O', 'CCCCCC(C)=O', 'ketone', { ri: 890 }),
  c('2-Nonanone', 'C9H18O', 'CCCCCCCC(C)=O', 'ketone', { ri: 1092 }),
  c('Acetophenone', 'C8H8O', 'CC(=O)c1ccccc1', 'ketone', { ri: 1065, cas: '98-86-2' }),
  c('Propiophenone', 'C9H10O', 'CCC(=O)c1ccccc1', 'ketone', { ri: 1160 }),
  c('Isophorone', 'C9H14O', 'CC1=CC(=O)CC(C)(C)C1', 'ketone', { ri: 1120 }),
  c('Camphor', 'C10H16O', 'CC1(C)C2CCC1(C)C(=O)C2', 'ketone', { ri: 1145 }),
  c('Benzophenone', 'C13H10O', 'O=C(c1ccccc1)c1ccccc1', 'ketone', { ri: 1630 }),
  // ---- aldehydes
  c('Acetaldehyde', 'C2H4O', 'CC=O', 'aldehyde', { synonyms: ['ethanal'] }),
  c('Propanal', 'C3H6O', 'CCC=O', 'aldehyde', { ri: 480 }),
  c('2-Methylpropanal', 'C4H8O', 'CC(C)C=O', 'aldehyde', { ri: 550, synonyms: ['isobutyraldehyde'] }),
  c('Butanal', 'C4H8O', 'CCCC=O', 'aldehyde', { ri: 595 }),
  c('Hexanal', 'C6H12O', 'CCCCCC=O', 'aldehyde', { ri: 800 }),
  c('Heptanal', 'C7H14O', 'CCCCCCC=O', 'aldehyde', { ri: 902 }),
  c('Octanal', 'C8H16O', 'CCCCCCCC=O', 'aldehyde', { ri: 1003 }),
  c('Nonanal', 'C9H18O', 'CCCCCCCCC=O', 'aldehyde', { ri: 1104 }),
  c('Decanal', 'C10H20O', 'CCCCCCCCCC=O', 'aldehyde', { ri: 1206 }),
  c('Benzaldehyde', 'C7H6O', 'O=Cc1ccccc1', 'aldehyde', { ri: 962, cas: '100-52-7' }),
  c('Phenylacetaldehyde', 'C8H8O', 'O=CCc1ccccc1', 'aldehyde', { ri: 1045 }),
  c('(E)-Cinnamaldehyde', 'C9H8O', 'O=C/C=C/c1ccccc1', 'aldehyde', { ri: 1270 }),
  c('Vanillin', 'C8H8O3', 'COc1cc(C=O)ccc1O', 'aldehyde', { ri: 1400, synonyms: ['4-hydroxy-3-methoxybenzaldehyde'] }),
  // ---- acids
  c('Acetic acid', 'C2H4O2', 'CC(=O)O', 'acid', { ri: 600, cas: '64-19-7', synonyms: ['ethanoic acid'] }),
  c('Propanoic acid', 'C3H6O2', 'CCC(=O)O', 'acid', { ri: 700, synonyms: ['propionic acid'] }),
  c('Butanoic acid', 'C4H8O2', 'CCCC(=O)O', 'acid', { ri: 800, synonyms: ['butyric acid'] }),
  c('3-Methylbutanoic acid', 'C5H10O2', 'CC(C)CC(=O)O', 'acid', { ri: 870, synonyms: ['isovaleric acid'] }),
  c('Hexanoic acid', 'C6H12O2', 'CCCCCC(=O)O', 'acid', { ri: 990, synonyms: ['caproic acid'] }),
  c('Octanoic acid', 'C8H16O2', 'CCCCCCCC(=O)O', 'acid', { ri: 1180, synonyms: ['caprylic acid'] }),
  c('Decanoic acid', 'C10H20O2', 'CCCCCCCCCC(=O)O', 'acid', { ri: 1370 }),
  c('Dodecanoic acid', 'C12H24O2', 'CCCCCCCCCCCC(=O)O', 'acid', { ri: 1565, synonyms: ['lauric acid'] }),
  c('Tetradecanoic acid', 'C14H28O2', 'CCCCCCCCCCCCCC(=O)O', 'acid', { ri: 1765, synonyms: ['myristic acid'] }),
  c('Hexadecanoic acid', 'C16H32O2', 'CCCCCCCCCCCCCCCC(=O)O', 'acid', { ri: 1965, synonyms: ['palmitic acid'] }),
  c('Octadecanoic acid', 'C18H36O2', 'CCCCCCCCCCCCCCCCCC(=O)O', 'acid', { ri: 2165, synonyms: ['stearic acid'] }),
  c('Benzoic acid', 'C7H6O2', 'OC(=O)c1ccccc1', 'acid', { ri: 1170, cas: '65-85-0' }),
  c('Phenylacetic acid', 'C8H8O2', 'OC(=O)Cc1ccccc1', 'acid', { ri: 1265 }),
  c('Salicylic acid', 'C7H6O3', 'OC(=O)c1ccccc1O', 'acid', { ri: 1300, synonyms: ['2-hydroxybenzoic acid'] }),
  // ---- esters
  c('Methyl acetate', 'C3H6O2', 'COC(C)=O', 'ester', { ri: 520 }),
  c('Ethyl acetate', 'C4H8O2', 'CCOC(C)=O', 'ester', { ri: 612, cas: '141-78-6', tags: ['solvent'] }),
  c('Vinyl acetate', 'C4H6O2', 'CC(=O)OC=C', 'ester', { ri: 570 }),
  c('Propyl acetate', 'C5H10O2', 'CCCOC(C)=O', 'ester', { ri: 710 }),
  c('Methyl methacrylate', 'C5H8O2', 'COC(=O)C(C)=C', 'ester', { ri: 700 }),
  c('Ethyl lactate', 'C5H10O3', 'CCOC(=O)C(C)O', 'ester', { ri: 810 }),
  c('Butyl acetate', 'C6H12O2', 'CCCCOC(C)=O', 'ester', { ri: 812, tags: ['solvent'] }),
  c('Ethyl butanoate', 'C6H12O2', 'CCCC(=O)OCC', 'ester', { ri: 800, synonyms: ['ethyl butyrate'] }),
  c('Isoamyl acetate', 'C7H14O2', 'CC(C)CCOC(C)=O', 'ester', { ri: 875, synonyms: ['3-methylbutyl acetate'] }),
  c('Methyl hexanoate', 'C7H14O2', 'CCCCCC(=O)OC', 'ester', { ri: 925 }),
  c('Acetic anhydride', 'C4H6O3', 'CC(=O)OC(C)=O', 'ester', { ri: 690 }),
  c('Methyl octanoate', 'C9H18O2', 'CCCCCCCC(=O)OC', 'ester', { ri: 1125 }),
  c('Methyl decanoate', 'C11H22O2', 'CCCCCCCCCC(=O)OC', 'ester', { ri: 1325 }),
  c('Methyl dodecanoate', 'C13H26O2', 'CCCCCCCCCCCC(=O)OC', 'ester', { ri: 1525, synonyms: ['methyl laurate'] }),
  c('Methyl tetradecanoate', 'C15H30O2', 'CCCCCCCCCCCCCC(=O)OC', 'ester', { ri: 1725, synonyms: ['methyl myristate'] }),
  c('Methyl hexadecanoate', 'C17H34O2', 'CCCCCCCCCCCCCCCC(=O)OC', 'ester', { ri: 1926, synonyms: ['methyl palmitate'] }),
  c('Methyl octadecanoate', 'C19H38O2', 'CCCCCCCCCCCCCCCCCC(=O)OC', 'ester', { ri: 2128, synonyms: ['methyl stearate'] }),
  c('Methyl benzoate', 'C8H8O2', 'COC(=O)c1ccccc1', 'ester', { ri: 1090 }),
  c('Ethyl benzoate', 'C9H10O2', 'CCOC(=O)c1ccccc1', 'ester', { ri: 1170 }),
  c('Methyl salicylate', 'C8H8O3', 'COC(=O)c1ccccc1O', 'ester', { ri: 1190 }),
  c('Dimethyl phthalate', 'C10H10O4', 'COC(=O)c1ccccc1C(=O)OC', 'ester', { ri: 1450 }),
  c('Diethyl phthalate', 'C12H14O4', 'CCOC(=O)c1ccccc1C(=O)OCC', 'ester', { ri: 1595 }),
  c('Dibutyl phthalate', 'C16H22O4', 'CCCCOC(=O)c1ccccc1C(=O)OCCCC', 'ester', { ri: 1965 }),
  // ---- ethers and O-heterocycles
  c('Diethyl ether', 'C4H10O', 'CCOCC', 'ether', { ri: 500, cas: '60-29-7', synonyms: ['ethoxyethane'], tags: ['solvent'] }),
  c('Methyl tert-butyl ether', 'C5H12O', 'COC(C)(C)C', 'ether', { ri: 560, synonyms: ['MTBE'], tags: ['solvent'] }),
  c('Diisopropyl ether', 'C6H14O', 'CC(C)OC(C)C', 'ether', { ri: 590, tags: ['solvent'] }),
  c('1,2-Dimethoxyethane', 'C4H10O2', 'COCCOC', 'ether', { ri: 645, tags: ['solvent'] }),
  c('Dibutyl ether', 'C8H18O', 'CCCCOCCCC', 'ether', { ri: 890 }),
  c('Anisole', 'C7H8O', 'COc1ccccc1', 'ether', { ri: 918, synonyms: ['methoxybenzene'] }),
  c('Phenetole', 'C8H10O', 'CCOc1ccccc1', 'ether', { ri: 990, synonyms: ['ethoxybenzene'] }),
  c('Diphenyl ether', 'C12H10O', 'c1ccc(Oc2ccccc2)cc1', 'ether', { ri: 1400 }),
  c('Tetrahydrofuran', 'C4H8O', 'C1CCOC1', 'O-heterocycle', { ri: 625, cas: '109-99-9', synonyms: ['THF'], tags: ['solvent'] }),
  c('2-Methyltetrahydrofuran', 'C5H10O', 'CC1CCCO1', 'O-heterocycle', { ri: 690, tags: ['solvent'] }),
  c('1,4-Dioxane', 'C4H8O2', 'C1COCCO1', 'O-heterocycle', { ri: 700, cas: '123-91-1', tags: ['solvent'] }),
  c('Furan', 'C4H4O', 'c1ccoc1', 'O-heterocycle', { ri: 500 }),
  c('2-Methylfuran', 'C5H6O', 'Cc1ccco1', 'O-heterocycle', { ri: 600 }),
  c('Furfural', 'C5H4O2', 'O=Cc1ccco1', 'O-heterocycle', { ri: 830, synonyms: ['2-furaldehyde'] }),
  c('Benzofuran', 'C8H6O', 'c1ccc2occc2c1', 'O-heterocycle', { ri: 1005 }),
  c('gamma-Butyrolactone', 'C4H6O2', 'O=C1CCCO1', 'O-heterocycle', { ri: 915 }),
  c('1,8-Cineole', 'C10H18O', 'CC12CCC(CC1)C(C)(C)O2', 'O-heterocycle', { ri: 1030, synonyms: ['eucalyptol'] }),
  c('Coumarin', 'C9H6O2', 'O=c1ccc2ccccc2o1', 'O-heterocycle', { ri: 1440, synonyms: ['2H-chromen-2-one'] }),
  c('Phthalic anhydride', 'C8H4O3', 'O=C1OC(=O)c2ccccc12', 'O-heterocycle', { ri: 1330 }),
  // ---- amines
  c('Diethylamine', 'C4H11N', 'CCNCC', 'amine', { ri: 580 }),
  c('Butylamine', 'C4H11N', 'CCCCN', 'amine', { ri: 640, synonyms: ['1-aminobutane'] }),
  c('Triethylamine', 'C6H15N', 'CCN(CC)CC', 'amine', { ri: 690 }),
  c('Dipropylamine', 'C6H15N', 'CCCNCCC', 'amine', { ri: 780 }),
  c('Hexylamine', 'C6H15N', 'CCCCCCN', 'amine', { ri: 850 }),
  c('Cyclohexylamine', 'C6H13N', 'NC1CCCCC1', 'amine', { ri: 880 }),
  c('Aniline', 'C6H7N', 'Nc1ccccc1', 'amine', { ri: 975, cas: '62-53-3', synonyms: ['benzenamine'] }),
  c('Benzylamine', 'C7H9N', 'NCc1ccccc1', 'amine', { ri: 1035 }),
  c('N-Methylaniline', 'C7H9N', 'CNc1ccccc1', 'amine', { ri: 1075 }),
  c('o-Toluidine', 'C7H9N', 'Cc1ccccc1N', 'amine', { ri: 1070, synonyms: ['2-methylaniline'] }),
  c('p-Toluidine', 'C7H9N', 'Cc1ccc(N)cc1', 'amine', { ri: 1075, synonyms: ['4-methylaniline'] }),
  c('N,N-Dimethylaniline', 'C8H11N', 'CN(C)c1ccccc1', 'amine', { ri: 1110 }),
  c('2-Phenylethylamine', 'C8H11N', 'NCCc1ccccc1', 'amine', { ri: 1115 }),
  c('Diphenylamine', 'C12H11N', 'c1ccc(Nc2ccccc2)cc1', 'amine', { ri: 1640 }),
  c('Ethanolamine', 'C2H7NO', 'NCCO', 'amine', { ri: 760, synonyms: ['2-aminoethanol'] }),
  // ---- amides
  c('Formamide', 'CH3NO', 'NC=O', 'amide'),
  c('Acetamide', 'C2H5NO', 'CC(N)=O', 'amide', { ri: 830 }),
  c('N-Methylacetamide', 'C3H7NO', 'CNC(C)=O', 'amide', { ri: 860 }),
  c('N,N-Dimethylformamide', 'C3H7NO', 'CN(C)C=O', 'amide', { ri: 780, cas: '68-12-2', synonyms: ['DMF'], tags: ['solvent'] }),
  c('N,N-Dimethylacetamide', 'C4H9NO', 'CC(=O)N(C)C', 'amide', { ri: 860, synonyms: ['DMAc'], tags: ['solvent'] }),
  c('N-Methyl-2-pyrrolidone', 'C5H9NO', 'CN1CCCC1=O', 'amide', { ri: 1040, synonyms: ['NMP'], tags: ['solvent'] }),
  c('Caprolactam', 'C6H11NO', 'O=C1CCCCCN1', 'amide', { ri: 1230, synonyms: ['azepan-2-one'] }),
  c('Benzamide', 'C7H7NO', 'NC(=O)c1ccccc1', 'amide', { ri: 1395 }),
  c('Acetanilide', 'C8H9NO', 'CC(=O)Nc1ccccc1', 'amide', { ri: 1400, synonyms: ['N-phenylacetamide'] }),
  c('Paracetamol', 'C8H9NO2', 'CC(=O)Nc1ccc(O)cc1', 'amide', { ri: 1650, synonyms: ['acetaminophen', '4-hydroxyacetanilide'] }),
  c('N,N-Diethyl-3-methylbenzamide', 'C12H17NO', 'CCN(CC)C(=O)c1cccc(C)c1', 'amide', { ri: 1590, synonyms: ['DEET'] }),
  // ---- nitriles
  c('Acetonitrile', 'C2H3N', 'CC#N', 'nitrile', { ri: 470, cas: '75-05-8', tags: ['solvent'] }),
  c('Acrylonitrile', 'C3H3N', 'C=CC#N', 'nitrile', { ri: 500 }),
  c('Propionitrile', 'C3H5N', 'CCC#N', 'nitrile', { ri: 560 }),
  c('Butyronitrile', 'C4H7N', 'CCCC#N', 'nitrile', { ri: 650, synonyms: ['butanenitrile'] }),
  c('Malononitrile', 'C3H2N2', 'N#CCC#N', 'nitrile', { ri: 720 }),
  c('Hexanenitrile', 'C6H11N', 'CCCCCC#N', 'nitrile', { ri: 870 }),
  c('Benzonitrile', 'C7H5N', 'N#Cc1ccccc1', 'nitrile', { ri: 980 }),
  c('Benzyl cyanide', 'C8H7N', 'N#CCc1ccccc1', 'nitrile', { ri: 1135, synonyms: ['phenylacetonitrile'] }),
  c('Adiponitrile', 'C6H8N2', 'N#CCCCCC#N', 'nitrile', { ri: 1180, synonyms: ['hexanedinitrile'] }),
  // ---- nitro compounds
  c('Nitromethane', 'CH3NO2', 'C[N+](=O)[O-]', 'nitro', { ri: 550 }),
  c('Nitroethane', 'C2H5NO2', 'CC[N+](=O)[O-]', 'nitro', { ri: 620 }),
  c('1-Nitropropane', 'C3H7NO2', 'CCC[N+](=O)[O-]', 'nitro', { ri: 710 }),
  c('Nitrobenzene', 'C6H5NO2', '[O-][N+](=O)c1ccccc1', 'nitro', { ri: 1095, cas: '98-95-3' }),
  c('2-Nitrotoluene', 'C7H7NO2', 'Cc1ccccc1[N+](=O)[O-]', 'nitro', { ri: 1200 }),
  c('4-Nitrotoluene', 'C7H7NO2', 'Cc1ccc(cc1)[N+](=O)[O-]', 'nitro', { ri: 1275 }),
  c('4-Nitrophenol', 'C6H5NO3', 'Oc1ccc(cc1)[N+](=O)[O-]', 'nitro', { ri: 1480 }),
  c('1,3-Dinitrobenzene', 'C6H4N2O4', '[O-][N+](=O)c1cccc(c1)[N+](=O)[O-]', 'nitro', { ri: 1490 }),
  c('2,4-Dinitrotoluene', 'C7H6N2O4', 'Cc1ccc(cc1[N+](=O)[O-])[N+](=O)[O-]', 'nitro', { ri: 1580 }),
  // ---- N-heterocycles
  c('Pyrrole', 'C4H5N', 'c1cc[nH]c1', 'N-heterocycle', { ri: 750, cas: '109-97-7' }),
  c('1-Methylpyrrole', 'C5H7N', 'Cn1cccc1', 'N-heterocycle', { ri: 740 }),
  c('Pyrrolidine', 'C4H9N', 'C1CCNC1', 'N-heterocycle', { ri: 670 }),
  c('Piperidine', 'C5H11N', 'C1CCNCC1', 'N-heterocycle', { ri: 730 }),
  c('Morpholine', 'C4H9NO', 'C1COCCN1', 'N-heterocycle', { ri: 810 }),
  c('Pyridine', 'C5H5N', 'c1ccncc1', 'N-heterocycle', { ri: 750, cas: '110-86-1', tags: ['solvent'] }),
  c('2-Methylpyridine', 'C6H7N', 'Cc1ccccn1', 'N-heterocycle', { ri: 820, synonyms: ['2-picoline'] }),
  c('3-Methylpyridine', 'C6H7N', 'Cc1cccnc1', 'N-heterocycle', { ri: 865, synonyms: ['3-picoline'] }),
  c('4-Methylpyridine', 'C6H7N', 'Cc1ccncc1', 'N-heterocycle', { ri: 870, synonyms: ['4-picoline'] }),
  c('2,6-Dimethylpyridine', 'C7H9N', 'Cc1cccc(C)n1', 'N-heterocycle', { ri: 885, synonyms: ['2,6-lutidine'] }),
  c('2-Acetylpyridine', 'C7H7NO', 'CC(=O)c1ccccn1', 'N-heterocycle', { ri: 1030 }),
  c('Pyrazine', 'C4H4N2', 'c1cnccn1', 'N-heterocycle', { ri: 730 }),
  c('2-Methylpyrazine', 'C5H6N2', 'Cc1cnccn1', 'N-heterocycle', { ri: 820 }),
  c('2,5-Dimethylpyrazine', 'C6H8N2', 'Cc1cnc(C)cn1', 'N-heterocycle', { ri: 910 }),
  c('Pyrimidine', 'C4H4N2', 'c1cncnc1', 'N-heterocycle', { ri: 720 }),
  c('1-Methylimidazole', 'C4H6N2', 'Cn1ccnc1', 'N-heterocycle', { ri: 910 }),
  c('Quinoline', 'C9H7N', 'c1ccc2ncccc2c1', 'N-heterocycle', { ri: 1240, cas: '91-22-5' }),
  c('Isoquinoline', 'C9H7N', 'c1ccc2cnccc2c1', 'N-heterocycle', { ri: 1260 }),
  c('Indole', 'C8H7N', 'c1ccc2[nH]ccc2c1', 'N-heterocycle', { ri: 1290, cas: '120-72-9' }),
  c('3-Methylindole', 'C9H9N', 'Cc1c[nH]c2ccccc12', 'N-heterocycle', { ri: 1385, synonyms: ['skatole'] }),
  c('Carbazole', 'C12H9N', 'c1ccc2c(c1)[nH]c1ccccc12', 'N-heterocycle', { ri: 1990 }),
  c('Acridine', 'C13H9N', 'c1ccc2nc3ccccc3cc2c1', 'N-heterocycle', { ri: 1740 }),
  c('Nicotine', 'C10H14N2', 'CN1CCCC1c1cccnc1', 'N-heterocycle', { ri: 1355, cas: '54-11-5' }),
  c('Caffeine', 'C8H10N4O2', 'Cn1cnc2c1c(=O)n(C)c(=O)n2C', 'N-heterocycle', { ri: 1840, cas: '58-08-2' }),
  // ---- sulfur compounds
  c('Carbon disulfide', 'CS2', 'S=C=S', 'sulfur', { cas: '75-15-0', tags: ['solvent'] }),
  c('Ethanethiol', 'C2H6S', 'CCS', 'sulfur', { ri: 500 }),
  c('Dimethyl sulfide', 'C2H6S', 'CSC', 'sulfur', { ri: 510 }),
  c('Dimethyl disulfide', 'C2H6S2', 'CSSC', 'sulfur', { ri: 740 }),
  c('Dimethyl trisulfide', 'C2H6S3', 'CSSSC', 'sulfur', { ri: 965 }),
  c('Diethyl sulfide', 'C4H10S', 'CCSCC', 'sulfur', { ri: 700 }),
  c('1-Butanethiol', 'C4H10S', 'CCCCS', 'sulfur', { ri: 720 }),
  c('Dimethyl sulfoxide', 'C2H6OS', 'CS(C)=O', 'sulfur', { ri: 800, cas: '67-68-5', synonyms: ['DMSO'], tags: ['solvent'] }),
  c('Sulfolane', 'C4H8O2S', 'O=S1(=O)CCCC1', 'sulfur', { ri: 1210, synonyms: ['tetramethylene sulfone'], tags: ['solvent'] }),
  c('Thiophene', 'C4H4S', 'c1ccsc1', 'sulfur', { ri: 665, cas: '110-02-1' }),
  c('2-Methylthiophene', 'C5H6S', 'Cc1cccs1', 'sulfur', { ri: 770 }),
  c('Thiophenol', 'C6H6S', 'Sc1ccccc1', 'sulfur', { ri: 925, synonyms: ['benzenethiol'] }),
  c('Thioanisole', 'C7H8S', 'CSc1ccccc1', 'sulfur', { ri: 1080, synonyms: ['methyl phenyl sulfide'] }),
  c('Benzothiophene', 'C8H6S', 'c1ccc2sccc2c1', 'sulfur', { ri: 1190 }),
  c('Benzothiazole', 'C7H5NS', 'c1ccc2scnc2c1', 'sulfur', { ri: 1220 }),
  c('Diphenyl sulfide', 'C12H10S', 'c1ccc(Sc2ccccc2)cc1', 'sulfur', { ri: 1620 }),
  c('Dibenzothiophene', 'C12H8S', 'c1ccc2c(c1)sc1ccccc12', 'sulfur', { ri: 1740 }),
  // ---- chlorinated
  c('Dichloromethane', 'CH2Cl2', 'ClCCl', 'halogenated', { ri: 525, cas: '75-09-2', synonyms: ['methylene chloride'], tags: ['solvent'] }),
  c('Chloroform', 'CHCl3', 'ClC(Cl)Cl', 'halogenated', { ri: 610, cas: '67-66-3', synonyms: ['trichloromethane'], tags: ['solvent'] }),
  c('Carbon tetrachloride', 'CCl4', 'ClC(Cl)(Cl)Cl', 'halogenated', { ri: 665, cas: '56-23-5', synonyms: ['tetrachloromethane'], tags: ['solvent'], molecularIon: 'absent' }),
  c('1,1-Dichloroethane', 'C2H4Cl2', 'CC(Cl)Cl', 'halogenated', { ri: 570 }),
  c('1,2-Dichloroethane', 'C2H4Cl2', 'ClCCCl', 'halogenated', { ri: 640, cas: '107-06-2', tags: ['solvent'] }),
  c('1,1,1-Trichloroethane', 'C2H3Cl3', 'CC(Cl)(Cl)Cl', 'halogenated', { ri: 640, cas: '71-55-6', tags: ['solvent'], molecularIon: 'absent' }),
  c('1,1,2-Trichloroethane', 'C2H3Cl3', 'ClCC(Cl)Cl', 'halogenated', { ri: 760 }),
  c('1,1,2,2-Tetrachloroethane', 'C2H2Cl4', 'ClC(Cl)C(Cl)Cl', 'halogenated', { ri: 880 }),
  c('Hexachloroethane', 'C2Cl6', 'ClC(Cl)(Cl)C(Cl)(Cl)Cl', 'halogenated', { ri: 1040, molecularIon: 'absent' }),
  c('1,1-Dichloroethene', 'C2H2Cl2', 'C=C(Cl)Cl', 'halogenated', { ri: 500, synonyms: ['vinylidene chloride'] }),
  c('cis-1,2-Dichloroethene', 'C2H2Cl2', 'Cl/C=C\\Cl', 'halogenated', { ri: 560 }),
  c('Trichloroethylene', 'C2HCl3', 'ClC=C(Cl)Cl', 'halogenated', { ri: 705, cas: '79-01-6', synonyms: ['trichloroethene'], tags: ['solvent'] }),
  c('Tetrachloroethylene', 'C2Cl4', 'ClC(Cl)=C(Cl)Cl', 'halogenated', { ri: 805, cas: '127-18-4', synonyms: ['perchloroethylene'], tags: ['solvent'] }),
  c('1,2-Dichloropropane', 'C3H6Cl2', 'CC(Cl)CCl', 'halogenated', { ri: 660 }),
  c('1-Chlorobutane', 'C4H9Cl', 'CCCCCl', 'halogenated', { ri: 655, synonyms: ['butyl chloride'] }),
  c('Epichlorohydrin', 'C3H5ClO', 'ClCC1CO1', 'halogenated', { ri: 730, synonyms: ['2-(chloromethyl)oxirane'] }),
  c('Chloroacetone', 'C3H5ClO', 'CC(=O)CCl', 'halogenated', { ri: 720 }),
  c('Chlorobenzene', 'C6H5Cl', 'Clc1ccccc1', 'halogenated', { ri: 845, cas: '108-90-7', tags: ['solvent'] }),
  c('1,2-Dichlorobenzene', 'C6H4Cl2', 'Clc1ccccc1Cl', 'halogenated', { ri: 1030, cas: '95-50-1' }),
  c('1,3-Dichlorobenzene', 'C6H4Cl2', 'Clc1cccc(Cl)c1', 'halogenated', { ri: 1005 }),
  c('1,4-Dichlorobenzene', 'C6H4Cl2', 'Clc1ccc(Cl)cc1', 'halogenated', { ri: 1010, cas: '106-46-7' }),
  c('1,2,4-Trichlorobenzene', 'C6H3Cl3', 'Clc1ccc(Cl)c(Cl)c1', 'halogenated', { ri: 1190 }),
  c('Hexachlorobenzene', 'C6Cl6', 'Clc1c(Cl)c(Cl)c(Cl)c(Cl)c1Cl', 'halogenated', { ri: 1720 }),
  c('2-Chlorotoluene', 'C7H7Cl', 'Cc1ccccc1Cl', 'halogenated', { ri: 975 }),
  c('4-Chlorotoluene', 'C7H7Cl', 'Cc1ccc(Cl)cc1', 'halogenated', { ri: 985 }),
  c('Benzyl chloride', 'C7H7Cl', 'ClCc1ccccc1', 'halogenated', { ri: 1040, synonyms: ['(chloromethyl)benzene'] }),
  c('2-Chlorophenol', 'C6H5ClO', 'Oc1ccccc1Cl', 'halogenated', { ri: 985 }),
  c('4-Chlorophenol', 'C6H5ClO', 'Oc1ccc(Cl)cc1', 'halogenated', { ri: 1210 }),
  c('2,4-Dichlorophenol', 'C6H4Cl2O', 'Oc1ccc(Cl)cc1Cl', 'halogenated', { ri: 1180 }),
  c('2,4,6-Trichlorophenol', 'C6H3Cl3O', 'Oc1c(Cl)cc(Cl)cc1Cl', 'halogenated', { ri: 1350 }),
  c('4-Chloroaniline', 'C6H6ClN', 'Nc1ccc(Cl)cc1', 'halogenated', { ri: 1225 }),
  c('1-Chloro-4-nitrobenzene', 'C6H4ClNO2', '[O-][N+](=O)c1ccc(Cl)cc1', 'halogenated', { ri: 1260 }),
  c('1-Chloronaphthalene', 'C10H7Cl', 'Clc1cccc2ccccc12', 'halogenated', { ri: 1430 }),
  // ---- brominated and mixed
  c('Dibromomethane', 'CH2Br2', 'BrCBr', 'halogenated', { ri: 690, cas: '74-95-3', synonyms: ['methylene bromide'] }),
  c('Bromochloromethane', 'CH2BrCl', 'ClCBr', 'halogenated', { ri: 610, cas: '74-97-5' }),
  c('Bromodichloromethane', 'CHBrCl2', 'ClC(Cl)Br', 'halogenated', { ri: 700, cas: '75-27-4' }),
  c('Dibromochloromethane', 'CHBr2Cl', 'ClC(Br)Br', 'halogenated', { ri: 800, cas: '124-48-1' }),
  c('Bromoform', 'CHBr3', 'BrC(Br)Br', 'halogenated', { ri: 905, cas: '75-25-2', synonyms: ['tribromomethane'] }),
  c('Tetrabromomethane', 'CBr4', 'BrC(Br)(Br)Br', 'halogenated', { ri: 1040, synonyms: ['carbon tetrabromide'] }),
  c('Bromoethane', 'C2H5Br', 'CCBr', 'halogenated', { ri: 480, synonyms: ['ethyl bromide'] }),
  c('1,2-Dibromoethane', 'C2H4Br2', 'BrCCBr', 'halogenated', { ri: 820, cas: '106-93-4', synonyms: ['ethylene dibromide'] }),
  c('1-Bromopropane', 'C3H7Br', 'CCCBr', 'halogenated', { ri: 600 }),
  c('2-Bromopropane', 'C3H7Br', 'CC(C)Br', 'halogenated', { ri: 530 }),
  c('1,3-Dibromopropane', 'C3H6Br2', 'BrCCCBr', 'halogenated', { ri: 960 }),
  c('1,2-Dibromo-3-chloropropane', 'C3H5Br2Cl', 'ClCC(Br)CBr', 'halogenated', { ri: 1100 }),
  c('1-Bromobutane', 'C4H9Br', 'CCCCBr', 'halogenated', { ri: 725 }),
  c('Bromobenzene', 'C6H5Br', 'Brc1ccccc1', 'halogenated', { ri: 935, cas: '108-86-1' }),
  c('1-Bromo-4-chlorobenzene', 'C6H4BrCl', 'Clc1ccc(Br)cc1', 'halogenated', { ri: 1090 }),
  c('1,4-Dibromobenzene', 'C6H4Br2', 'Brc1ccc(Br)cc1', 'halogenated', { ri: 1170 }),
  c('4-Bromotoluene', 'C7H7Br', 'Cc1ccc(Br)cc1', 'halogenated', { ri: 1060 }),
  c('Benzyl bromide', 'C7H7Br', 'BrCc1ccccc1', 'halogenated', { ri: 1120, synonyms: ['(bromomethyl)benzene'] }),
  c('2-Bromophenol', 'C6H5BrO', 'Oc1ccccc1Br', 'halogenated', { ri: 1060 }),
  c('4-Bromoanisole', 'C7H7BrO', 'COc1ccc(Br)cc1', 'halogenated', { ri: 1170 }),
  c('1-Bromonaphthalene', 'C10H7Br', 'Brc1cccc2ccccc12', 'halogenated', { ri: 1520 }),
  c('Iodomethane', 'CH3I', 'CI', 'halogenated', { synonyms: ['methyl iodide'] }),
  c('Iodobenzene', 'C6H5I', 'Ic1ccccc1', 'halogenated', { ri: 1110 }),
  // ---- fluorinated
  c('Fluorobenzene', 'C6H5F', 'Fc1ccccc1', 'fluorinated', { ri: 665 }),
  c('1,4-Difluorobenzene', 'C6H4F2', 'Fc1ccc(F)cc1', 'fluorinated', { ri: 680 }),
  c('Hexafluorobenzene', 'C6F6', 'Fc1c(F)c(F)c(F)c(F)c1F', 'fluorinated', { ri: 560 }),
  c('4-Fluorotoluene', 'C7H7F', 'Cc1ccc(F)cc1', 'fluorinated', { ri: 775 }),
  c('(Trifluoromethyl)benzene', 'C7H5F3', 'FC(F)(F)c1ccccc1', 'fluorinated', { ri: 740, synonyms: ['benzotrifluoride'] }),
  c('1-Bromo-4-fluorobenzene', 'C6H4BrF', 'Fc1ccc(Br)cc1', 'fluorinated', { ri: 900 }),
  c('4-Fluoroaniline', 'C6H6FN', 'Nc1ccc(F)cc1', 'fluorinated', { ri: 1030 }),
  c('2,2,2-Trifluoroethanol', 'C2H3F3O', 'OCC(F)(F)F', 'fluorinated', { ri: 480 }),
  c('Trifluoroacetic acid', 'C2HF3O2', 'OC(=O)C(F)(F)F', 'fluorinated', { ri: 520 }),
  // ---- organosilicon and TMS derivatives
  c('Tetramethylsilane', 'C4H12Si', 'C[Si](C)(C)C', 'organosilicon', { ri: 450, synonyms: ['TMS'] }),
  c('Hexamethyldisiloxane', 'C6H18OSi2', 'C[Si](C)(C)O[Si](C)(C)C', 'organosilicon', { ri: 600, synonyms: ['HMDSO'] }),
  c('Octamethylcyclotetrasiloxane', 'C8H24O4Si4', 'C[Si]1(C)O[Si](C)(C)O[Si](C)(C)O[Si](C)(C)O1', 'organosilicon', { ri: 985, synonyms: ['D4'], tags: ['column bleed'] }),
  c('Decamethylcyclopentasiloxane', 'C10H30O5Si5', 'C[Si]1(C)O[Si](C)(C)O[Si](C)(C)O[Si](C)(C)O[Si](C)(C)O1', 'organosilicon', { ri: 1160, synonyms: ['D5'], tags: ['column bleed'] }),
  c('Trimethyl(phenoxy)silane', 'C9H14OSi', 'C[Si](C)(C)Oc1ccccc1', 'TMS derivative', { ri: 1045, synonyms: ['phenol, TMS ether'], derivative: 'TMS', parentCompound: 'Phenol' }),
  c('Trimethylsilyl benzoate', 'C10H14O2Si', 'C[Si](C)(C)OC(=O)c1ccccc1', 'TMS derivative', { ri: 1250, synonyms: ['benzoic acid, TMS ester'], derivative: 'TMS', parentCompound: 'Benzoic acid' }),
  c('Lactic acid, 2TMS derivative', 'C9H22O3Si2', 'CC(O[Si](C)(C)C)C(=O)O[Si](C)(C)C', 'TMS derivative', { ri: 1070, derivative: 'TMS (2)', parentCompound: 'Lactic acid' }),
  c('Glycerol, 3TMS derivative', 'C12H32O3Si3', 'C[Si](C)(C)OCC(O[Si](C)(C)C)CO[Si](C)(C)C', 'TMS derivative', { ri: 1290, derivative: 'TMS (3)', parentCompound: 'Glycerol' }),
  c('Hexadecanoic acid, TMS ester', 'C19H40O2Si', 'CCCCCCCCCCCCCCCC(=O)O[Si](C)(C)C', 'TMS derivative', { ri: 2050, synonyms: ['palmitic acid, TMS ester'], derivative: 'TMS', parentCompound: 'Hexadecanoic acid' }),
];
