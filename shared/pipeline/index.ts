export * from './analyse-logs';
export * from './apply-analysis';
