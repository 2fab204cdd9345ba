// The public entry of the auth feature: what other features may use (lint forbids reaching past it).
export { authKeys, fetchMe, forgetOtherQueries, useCan, useMe } from './api';
