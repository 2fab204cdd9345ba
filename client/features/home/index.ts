// The public entry of the home feature: what other features and routes may use (lint forbids reaching past it).
export { RoleHome } from './components/RoleHome';
