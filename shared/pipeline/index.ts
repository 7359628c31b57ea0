export * from './analyse-logs';
export * from './apply-analysis';
export * from './prepare-log';
export * from './estimate-baro';
