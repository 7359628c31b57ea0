export * from './filter-rules';
export * from './filter-samples';
export * from './sample-expression';
export * from './savitzky-golay';
export * from './savitzky-golay-series';
