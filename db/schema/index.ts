export * from './shops';
export * from './users';
export * from './invitations';
export * from './audit-events';
export * from './sessions';
