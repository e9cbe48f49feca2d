import { ELECTRON_MASS } from './constants';
import { monoisotopicMass } from './monoisotopicMass';
import { parseFormula } from './parseFormula';

export interface FragmentIonComposition {
  /** Hill formula of the cation */
  formula: string;
  /** m/z of the singly charged cation (electron mass subtracted) */
  mz: number;
  /** what it usually points to */
  note: string;
}

export interface CommonFragmentIon {
  /** nominal m/z */
  mz: number;
  ions: FragmentIonComposition[];
}

// Fragment ions practitioners recognize on sight in EI spectra (common practice,
// no source; the notes are the usual first readings).
const TABLE: Array<[number, Array<[string, string]>]> = [
  [15, [['CH3', 'methyl']]],
  [18, [['H2O', 'water (background, alcohols)']]],
  [26, [['C2H2', 'acetylene']]],
  [27, [['C2H3', 'vinyl'], ['CHN', 'HCN (nitrogen compounds)']]],
  [28, [['CO', 'carbon monoxide'], ['C2H4', 'ethylene'], ['N2', 'nitrogen (air background)']]],
  [29, [['CHO', 'formyl'], ['C2H5', 'ethyl']]],
  [30, [['CH4N', 'iminium CH2=NH2+ (primary amines)'], ['NO', 'nitric oxide (nitro compounds, nitrates)']]],
  [31, [['CH3O', 'CH2=OH+ (primary alcohols, methyl ethers)']]],
  [32, [['O2', 'oxygen (air background)']]],
  [39, [['C3H3', 'propargyl / cyclopropenyl (aromatics)']]],
  [41, [['C3H5', 'allyl']]],
  [42, [['C2H2O', 'ketene'], ['C3H6', 'propene']]],
  [43, [['C3H7', 'propyl / isopropyl'], ['C2H3O', 'acetyl']]],
  [44, [['CO2', 'carbon dioxide (background)'], ['C2H6N', 'iminium (amines)'], ['C2H4O', 'McLafferty ion of aldehydes']]],
  [45, [['C2H5O', 'CH3CH=OH+ / CH3OCH2+ (alcohols, ethers)'], ['CHO2', 'carboxyl']]],
  [47, [['CH3S', 'CH2=SH+ (thiols, sulfides)']]],
  [49, [['CH2Cl', 'chloromethyl']]],
  [50, [['C4H2', 'aromatic fragment']]],
  [51, [['C4H3', 'aromatic fragment']]],
  [55, [['C4H7', 'butenyl'], ['C3H3O', 'acryloyl']]],
  [57, [['C4H9', 'butyl'], ['C3H5O', 'propionyl']]],
  [58, [['C3H8N', 'iminium (amines)'], ['C3H6O', 'McLafferty ion of methyl ketones']]],
  [59, [['C3H7O', 'oxonium (alcohols, ethers)'], ['C2H3O2', 'methoxycarbonyl']]],
  [60, [['C2H4O2', 'McLafferty ion of carboxylic acids']]],
  [65, [['C5H5', 'cyclopentadienyl (from tropylium)']]],
  [69, [['CF3', 'trifluoromethyl'], ['C5H9', 'pentenyl']]],
  [71, [['C5H11', 'pentyl'], ['C4H7O', 'butyryl']]],
  [73, [['C3H9Si', 'trimethylsilyl'], ['C4H9O', 'oxonium']]],
  [74, [['C3H6O2', 'McLafferty ion of methyl esters']]],
  [77, [['C6H5', 'phenyl']]],
  [78, [['C6H6', 'benzene']]],
  [79, [['Br', 'bromine'], ['C6H7', 'protonated benzene']]],
  [85, [['C6H13', 'hexyl'], ['C5H9O', 'acylium']]],
  [89, [['C3H9OSi', 'trimethylsilyloxy (TMS ethers)']]],
  [91, [['C7H7', 'tropylium / benzyl (alkylbenzenes)']]],
  [92, [['C7H8', 'McLafferty ion of alkylbenzenes']]],
  [105, [['C7H5O', 'benzoyl'], ['C8H9', 'methyltropylium']]],
  [115, [['C9H7', 'indenyl']]],
  [127, [['I', 'iodine']]],
  [128, [['HI', 'hydrogen iodide']]],
  [147, [['C5H15OSi2', 'TMS-O-dimethylsilyl (TMS derivatives)']]],
  [149, [['C8H5O3', 'protonated phthalic anhydride (phthalates)']]],
];

/**
 * The trade's common fragment ions of EI spectra, each nominal m/z with its
 * likely compositions and the exact m/z of the singly charged cation.
 */
export const commonFragmentIons: readonly CommonFragmentIon[] = Object.freeze(
  TABLE.map(([mz, ions]) => ({
    mz,
    ions: ions.map(([formula, note]) => ({
      formula: parseFormula(formula).hill,
      mz: monoisotopicMass(formula) - ELECTRON_MASS,
      note,
    })),
  })),
);
