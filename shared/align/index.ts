export * from './align-lambda';
export * from './command-answer-lag';
export * from './estimate-lambda-delay';
export * from './find-delay-events';
export * from './interpolate-at-time';
export * from './log-airflow';
export * from './measure-event-lag';
export * from './transport-delay';
