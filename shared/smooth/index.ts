export * from './gaussian-filter';
export * from './smooth-table';
