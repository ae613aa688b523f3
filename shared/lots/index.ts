export * from './compare-lots';
