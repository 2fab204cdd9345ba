/**
 * Standard rights URIs for a piece's objectRights and imageRights.
 *
 * Only the two families IIIF Presentation 3.0 names for `rights` are accepted (https://iiif.io/api/presentation/3.0/#rights:
 * "drawn from the set of Creative Commons license URIs, the RightsStatements.org rights statement URIs, or those added via
 * the extension mechanism"). The lists below are recalled from memory of the two publishers' pages
 * (https://creativecommons.org/licenses/ and https://rightsstatements.org/page/1.0/): the six CC licences (1.0 to 4.0,
 * optionally a jurisdiction port), CC0 1.0 and the Public Domain Mark 1.0, and the twelve RightsStatements.org 1.0
 * statements. Both publishers' canonical URIs are http:// (IIIF's discussion of `rights`, IIIF/api issues #1874 and
 * #2010, and the @base of RightsStatements.org's data model); https:// is accepted and stored as the http:// form.
 */
const CC_LICENCES = 'by|by-sa|by-nd|by-nc|by-nc-sa|by-nc-nd';
const RS_STATEMENTS = 'InC|InC-OW-EU|InC-EDU|InC-NC|InC-RUU|NoC-CR|NoC-NC|NoC-OKLR|NoC-US|CNE|UND|NKC';

export const RIGHTS_URI_PATTERN = new RegExp(
  '^https?://(?:' +
    `creativecommons\\.org/licenses/(?:${CC_LICENCES})/[1-4]\\.0/(?:[a-z]{2}/)?` +
    '|creativecommons\\.org/publicdomain/(?:zero|mark)/1\\.0/' +
    `|rightsstatements\\.org/vocab/(?:${RS_STATEMENTS})/1\\.0/` +
    ')$',
);

export const RIGHTS_MESSAGE =
  'Use a Creative Commons or RightsStatements.org URI, e.g. http://creativecommons.org/licenses/by/4.0/ or http://rightsstatements.org/vocab/InC/1.0/';

/** The canonical (http://) form of an accepted rights URI. */
export const canonicalRights = (uri: string) => uri.replace(/^https:\/\//, 'http://');

/** The choices the piece form offers (any other URI of the two families may be typed). */
export const RIGHTS_CHOICES = [
  { uri: 'http://creativecommons.org/publicdomain/mark/1.0/', label: 'Public Domain Mark 1.0' },
  { uri: 'http://creativecommons.org/publicdomain/zero/1.0/', label: 'CC0 1.0 (no rights reserved)' },
  { uri: 'http://creativecommons.org/licenses/by/4.0/', label: 'CC BY 4.0' },
  { uri: 'http://creativecommons.org/licenses/by-sa/4.0/', label: 'CC BY-SA 4.0' },
  { uri: 'http://creativecommons.org/licenses/by-nc/4.0/', label: 'CC BY-NC 4.0' },
  { uri: 'http://creativecommons.org/licenses/by-nc-sa/4.0/', label: 'CC BY-NC-SA 4.0' },
  { uri: 'http://creativecommons.org/licenses/by-nd/4.0/', label: 'CC BY-ND 4.0' },
  { uri: 'http://creativecommons.org/licenses/by-nc-nd/4.0/', label: 'CC BY-NC-ND 4.0' },
  { uri: 'http://rightsstatements.org/vocab/InC/1.0/', label: 'In Copyright' },
  { uri: 'http://rightsstatements.org/vocab/InC-EDU/1.0/', label: 'In Copyright – Educational Use Permitted' },
  { uri: 'http://rightsstatements.org/vocab/InC-NC/1.0/', label: 'In Copyright – Non-Commercial Use Permitted' },
  { uri: 'http://rightsstatements.org/vocab/InC-RUU/1.0/', label: 'In Copyright – Rights-holder(s) Unlocatable' },
  { uri: 'http://rightsstatements.org/vocab/NoC-US/1.0/', label: 'No Copyright – United States' },
  { uri: 'http://rightsstatements.org/vocab/NoC-NC/1.0/', label: 'No Copyright – Non-Commercial Use Only' },
  { uri: 'http://rightsstatements.org/vocab/NoC-OKLR/1.0/', label: 'No Copyright – Other Known Legal Restrictions' },
  { uri: 'http://rightsstatements.org/vocab/CNE/1.0/', label: 'Copyright Not Evaluated' },
  { uri: 'http://rightsstatements.org/vocab/UND/1.0/', label: 'Copyright Undetermined' },
  { uri: 'http://rightsstatements.org/vocab/NKC/1.0/', label: 'No Known Copyright' },
] as const;

/** A short name for a rights URI (for the requiredStatement and the piece page); the URI itself when not a listed one. */
export function rightsLabel(uri: string): string {
  const bare = uri.replace(/^https:/, 'http:');
  const known = RIGHTS_CHOICES.find((c) => c.uri === bare);
  if (known) return known.label;
  const cc = bare.match(/licenses\/([a-z-]+)\/(\d\.\d)\/(?:([a-z]{2})\/)?$/);
  if (cc) return `CC ${cc[1].toUpperCase()} ${cc[2]}${cc[3] ? ` (${cc[3]})` : ''}`;
  return uri;
}
