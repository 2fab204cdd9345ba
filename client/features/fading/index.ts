// The public entry of the fading-pairs feature (issue 17, point 5).
export { FadingPairs } from './components/FadingPairs';
export { fadingKeys } from './api';
