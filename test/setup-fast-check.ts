// Every fast-check property runs from a fixed seed, so a CI run is the same run every time; set
// FC_SEED to explore other seeds locally (a failure prints the seed and path to replay it).
import fc from 'fast-check';

fc.configureGlobal({ seed: Number(process.env.FC_SEED ?? 20261202) });
