export * from './listQuery';
export * from './buildListWhere';
export * from './nameIndex';
export * from './listRecords';
export * from './getRecord';
export * from './toCsv';
export * from './exportRecordsCsv';
