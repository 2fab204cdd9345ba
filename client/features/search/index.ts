// The public entry of the search feature: what other features may use (lint forbids reaching past it).
export { ShadeSearchLink } from './components/ShadeSearchLink';
