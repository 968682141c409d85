export * from './api-types';
