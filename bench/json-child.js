'use strict';
// One node child that reports on its last stdout line as JSON (the memory and database cases run
// their measured work this way, so each has a process of its own to measure).
const { spawn } = require('child_process');

/**
 * @param {string[]} args node's arguments: the child script, then its own
 * @param {number} timeoutMs the child is killed after this
 * @param {{ echo?: boolean }} [options] echo: pass the child's stderr through, indented (its phases, for a long run)
 * @returns {Promise<{ value: any } | { failure: string, stderr: string[] }>} the parsed last line, or why there is none and the start of stderr
 */
function runJsonChild(args, timeoutMs, options = {}) {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, args, { stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    let err = '';
    const timer = setTimeout(() => child.kill('SIGKILL'), timeoutMs);
    child.stdout.on('data', (c) => (out += c));
    child.stderr.on('data', (c) => {
      err = (err + c).slice(-2000);
      if (options.echo) process.stderr.write(String(c).replace(/^/gm, '    '));
    });
    child.on('exit', (code, signal) => {
      clearTimeout(timer);
      if (code === 0) {
        try {
          // No last line: JSON.parse(undefined) throws into the catch.
          return resolve({ value: JSON.parse(/** @type {string} */ (out.trim().split('\n').pop())) });
        } catch {
          /* fall through to the failure below */
        }
      }
      const failure = signal === 'SIGKILL' ? `stopped after ${timeoutMs / 1000} s` : `ended with ${signal ?? code}`;
      resolve({ failure, stderr: err.split('\n') });
    });
  });
}

module.exports = { runJsonChild };
