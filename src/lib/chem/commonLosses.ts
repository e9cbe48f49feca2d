import { monoisotopicMass } from './monoisotopicMass';
import { parseFormula } from './parseFormula';

export interface LossComposition {
  /** Hill formula of the neutral lost, isotopic label where it matters ([37Cl]) */
  formula: string;
  /** monoisotopic mass of the neutral in u */
  mass: number;
  /** what it usually points to */
  note: string;
}

export interface CommonLoss {
  /** nominal mass lost */
  loss: number;
  compositions: LossComposition[];
}

// Neutral losses from the molecular ion that practitioners read routinely
// (common practice, no source; the notes are the usual first guesses).
const TABLE: Array<[number, Array<[string, string]>]> = [
  [1, [['H', 'hydrogen atom']]],
  [2, [['H2', 'hydrogen molecule']]],
  [15, [['CH3', 'methyl']]],
  [16, [['O', 'oxygen (N-oxides, nitro compounds)'], ['NH2', 'amino (amides)'], ['CH4', 'methane']]],
  [17, [['OH', 'hydroxyl (acids, nitro compounds)'], ['NH3', 'ammonia']]],
  [18, [['H2O', 'water (alcohols, acids)']]],
  [19, [['F', 'fluorine']]],
  [20, [['HF', 'hydrogen fluoride']]],
  [26, [['C2H2', 'acetylene (aromatics)'], ['CN', 'cyano']]],
  [27, [['HCN', 'hydrogen cyanide (N-heteroaromatics, nitriles)'], ['C2H3', 'vinyl']]],
  [28, [['CO', 'carbon monoxide (phenols, quinones, ketones)'], ['C2H4', 'ethylene (McLafferty, ethyl esters)']]],
  [29, [['CHO', 'formyl (aldehydes, phenols)'], ['C2H5', 'ethyl']]],
  [30, [['CH2O', 'formaldehyde (methyl aryl ethers)'], ['NO', 'nitric oxide (nitro compounds)'], ['C2H6', 'ethane']]],
  [31, [['CH3O', 'methoxy (methyl esters, ethers)'], ['CH5N', 'methylamine']]],
  [32, [['CH4O', 'methanol (methyl esters)'], ['S', 'sulfur']]],
  [33, [['HS', 'mercapto']]],
  [34, [['H2S', 'hydrogen sulfide (thiols)']]],
  [35, [['Cl', 'chlorine']]],
  [36, [['ClH', 'hydrogen chloride']]],
  [37, [['[37Cl]', 'chlorine-37']]],
  [38, [['[37Cl]H', 'hydrogen chloride (37Cl)']]],
  [41, [['C3H5', 'allyl']]],
  [42, [['C2H2O', 'ketene (acetates, acetamides)'], ['C3H6', 'propene']]],
  [43, [['C3H7', 'propyl'], ['C2H3O', 'acetyl (methyl ketones)']]],
  [44, [['CO2', 'carbon dioxide (anhydrides, esters)'], ['C3H8', 'propane'], ['C2H6N', 'dimethylamino']]],
  [45, [['CHO2', 'carboxyl'], ['C2H5O', 'ethoxy (ethyl esters)']]],
  [46, [['NO2', 'nitro'], ['C2H6O', 'ethanol (ethyl esters)']]],
  [47, [['CH3S', 'methylthio']]],
  [55, [['C4H7', 'butenyl']]],
  [56, [['C4H8', 'butene']]],
  [57, [['C4H9', 'butyl'], ['C3H5O', 'propionyl']]],
  [59, [['C2H3O2', 'acetoxy, methoxycarbonyl']]],
  [60, [['C2H4O2', 'acetic acid (acetates)']]],
  [71, [['C5H11', 'pentyl']]],
  [77, [['C6H5', 'phenyl']]],
  [79, [['Br', 'bromine']]],
  [80, [['BrH', 'hydrogen bromide']]],
  [81, [['[81Br]', 'bromine-81']]],
  [82, [['[81Br]H', 'hydrogen bromide (81Br)']]],
  [91, [['C7H7', 'benzyl']]],
  [127, [['I', 'iodine']]],
  [128, [['HI', 'hydrogen iodide']]],
];

/**
 * The trade's common neutral losses from M, each nominal loss with its likely
 * compositions and their monoisotopic masses. Losses of about 3–14 and 21–25 u
 * are absent on purpose: few molecules show them.
 */
export const commonLosses: readonly CommonLoss[] = Object.freeze(
  TABLE.map(([loss, compositions]) => ({
    loss,
    compositions: compositions.map(([formula, note]) => ({
      formula: parseFormula(formula).hill,
      mass: monoisotopicMass(formula),
      note,
    })),
  })),
);
