export * from './roles';
export * from './money';
export * from './auth/password-policy';
export * from './branches/branch-rules';
export * from './permissions/abilities';
export * from './permissions/scope';
export * from './api/types';
