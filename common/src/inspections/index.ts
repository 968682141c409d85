// Inspections: the findings checklist, wall-clock times in a branch's zone, and the wire shapes.
export * from './findings';
export * from './local-time';
export * from './types';
