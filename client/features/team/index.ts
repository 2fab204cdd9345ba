// The public entry of the team feature: what other features may use (lint forbids reaching past it).
export { roleLabel } from './roles';
