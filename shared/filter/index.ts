export * from './filter-rules';
export * from './filter-samples';
export * from './lambda-ceiling';
export * from './sample-expression';
export * from './savitzky-golay';
export * from './savitzky-golay-series';
