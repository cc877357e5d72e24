export * from './condensed';
