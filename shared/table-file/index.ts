export * from './parse-table-file';
export * from './read-table-layout';
export * from './table-file-error';
export * from './table-labels';
