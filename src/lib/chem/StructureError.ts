/** A SMILES string or molfile that openchemlib cannot read. */
export class StructureError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'StructureError';
  }
}
