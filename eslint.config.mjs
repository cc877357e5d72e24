// The lint check of `npm run lint` (and CI): the recommended rules of ESLint and typescript-eslint,
// without type information (fast), plus the house rules of DESIGN.md that a linter can see.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'docs/**', 'notebooks/**', '**/*.assembled.ts', 'src/methods/partition/kernels/assembled.ts'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: {
      globals: {
        process: 'readonly',
        console: 'readonly',
        require: 'readonly',
        module: 'writable',
        __dirname: 'readonly',
        Buffer: 'readonly',
        setTimeout: 'readonly',
        clearTimeout: 'readonly',
        setImmediate: 'readonly',
        URL: 'readonly',
        TextDecoder: 'readonly',
        TextEncoder: 'readonly',
        performance: 'readonly',
        globalThis: 'readonly',
        WebAssembly: 'readonly',
        global: 'readonly',
        __filename: 'readonly',
        queueMicrotask: 'readonly',
        structuredClone: 'readonly',
        SharedArrayBuffer: 'readonly',
        Atomics: 'readonly',
      },
    },
    rules: {
      // The compiler's noUnusedLocals already checks this, with the same meaning.
      '@typescript-eslint/no-unused-vars': 'off',
      // CommonJS scripts and the tests' dynamic loading use require on purpose.
      '@typescript-eslint/no-require-imports': 'off',
      // Deliberate `as never` / any at a few boundaries (kernels, plotting) are named where they are.
      '@typescript-eslint/no-explicit-any': 'off',
      // Escaping code and its tests match control characters on purpose (terminal, SQL, CSV rules).
      'no-control-regex': 'off',
      // `cond ? expect(a)… : expect(b)…` in tests is a statement on purpose.
      '@typescript-eslint/no-unused-expressions': ['error', { allowTernary: true }],
    },
  },
  {
    // Tests write numbers beyond double precision on purpose (ids and cells that must stay text).
    files: ['test/**/*.ts'],
    rules: { 'no-loss-of-precision': 'off' },
  },
  {
    // The core: one seeded generator (src/random.ts), never Math.random().
    files: ['src/**/*.ts'],
    rules: {
      'no-restricted-properties': ['error', { object: 'Math', property: 'random', message: 'Use the seeded generator of src/random.ts.' }],
    },
  },
);
