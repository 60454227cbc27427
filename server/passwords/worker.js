'use strict';
// A piscina task file. Plain CommonJS on purpose: piscina requires it directly in a worker
// thread, where neither tsx's nor jest's TypeScript transform applies.
const fs = require('node:fs');
const path = require('node:path');
const vm = require('node:vm');

const distDir = path.dirname(require.resolve('argon2-browser/dist/argon2.js'));

// argon2-browser's Node path requires dist/argon2.js, whose Emscripten loader sees Node's global
// fetch, "fetches" the .wasm by file path, fails, and aborts the runtime from an unhandled
// rejection. Given the bytes as Module.wasmBinary, the loader fetches nothing. The loader only
// reads such overrides from self.Module, so it runs with a `self` of its own rather than a global
// one. The module is returned before its runtime has started: argon2-browser then waits for
// postRun, which would never come for a runtime that had already finished starting.
globalThis.loadArgon2WasmModule = () => {
  const gluePath = path.join(distDir, 'argon2.js');
  const startGlue = vm.compileFunction(
    `${fs.readFileSync(gluePath, 'utf8')}\nreturn Module;`,
    ['self', 'require', '__dirname'],
    { filename: gluePath },
  );
  const wasmBinary = fs.readFileSync(path.join(distDir, 'argon2.wasm'));
  return Promise.resolve(startGlue({ Module: { wasmBinary } }, require, distDir));
};

const argon2 = require('argon2-browser');

// ARGON2_VERIFY_MISMATCH in the reference implementation's argon2.h.
const VERIFY_MISMATCH = -35;

// argon2-browser rejects with a plain { message, code } object; an Error keeps its meaning and a
// stack across the thread boundary.
function toError(action, failure) {
  const message = failure && failure.message ? String(failure.message) : 'unknown failure';
  const code = failure && failure.code !== undefined ? ` (code ${failure.code})` : '';
  return new Error(`argon2 ${action} failed: ${message}${code}`);
}

/**
 * @param {{ password: string, salt: Uint8Array, hashBytes: number,
 *   cost: { memoryKiB: number, iterations: number, parallelism: number } }} task
 * @returns {Promise<string>} the PHC string, e.g. $argon2id$v=19$m=19456,t=2,p=1$<salt>$<hash>
 */
async function hash({ password, salt, hashBytes, cost }) {
  try {
    const result = await argon2.hash({
      pass: password,
      salt,
      time: cost.iterations,
      mem: cost.memoryKiB,
      parallelism: cost.parallelism,
      hashLen: hashBytes,
      type: argon2.ArgonType.Argon2id,
    });
    return result.encoded;
  } catch (failure) {
    throw toError('hash', failure);
  }
}

/**
 * True on a match, false on a wrong password. Anything else, a string argon2 cannot decode
 * included, throws: the hasher screens malformed strings out before they get here.
 * @param {{ password: string, encoded: string }} task
 * @returns {Promise<boolean>}
 */
async function verify({ password, encoded }) {
  let failure;
  try {
    // Resolves with nothing on a match, or with { code } when argon2's message was unreadable.
    failure = await argon2.verify({ pass: password, encoded, type: argon2.ArgonType.Argon2id });
  } catch (thrown) {
    failure = thrown;
  }
  if (failure === undefined) return true;
  if (failure && failure.code === VERIFY_MISMATCH) return false;
  throw toError('verify', failure);
}

module.exports = { hash, verify };
