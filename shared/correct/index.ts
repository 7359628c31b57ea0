export * from './base-grid';
export * from './flag-lean-cells';
export * from './propose-table';
export * from './load-guard';
