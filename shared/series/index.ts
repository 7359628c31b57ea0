export * from './bucket-series';
