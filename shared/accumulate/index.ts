export * from './accumulate-cells';
export * from './bilinear';
