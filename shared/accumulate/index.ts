export * from './accumulate-cells';
export * from './bilinear';
export * from './validate-grid';
