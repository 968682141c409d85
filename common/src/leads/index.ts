export * from './pipeline';
export * from './duplicates';
export * from './lead-fields';
