// The public entry of the recipe-suggestions feature: the page, and the link other features put beside a colour.
export { SuggestionsPage } from './components/SuggestionsPage';
export { SuggestRecipeLink } from './components/SuggestRecipeLink';
