// Transfer functions of a net at complex frequencies. The chain (ABCD) sweep this file held is now the
// nodal solver of nodal.ts (each line's exact two-port stamped into a nodal matrix), which covers
// chains and trees alike; the name stays for the callers that import it from here.
export { transferFunctions } from './nodal.js';
