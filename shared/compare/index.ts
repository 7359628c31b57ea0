export * from './compare-tables';
