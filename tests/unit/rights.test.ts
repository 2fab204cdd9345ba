import { describe, expect, it } from 'vitest';
import cases from '../reference/rights-uris.json' with { type: 'json' };
import { canonicalRights, RIGHTS_URI_PATTERN, rightsLabel } from '../../shared/rights.ts';

// Rights URIs accepted for objectRights and imageRights: Creative Commons and RightsStatements.org only, as IIIF
// Presentation 3.0 `rights` requires (cases and their sources in tests/reference/rights-uris.json).
describe('rights URIs', () => {
  it.each(cases.map((c) => [c.uri, c.valid] as const))('%s → %s', (uri, valid) => {
    expect(RIGHTS_URI_PATTERN.test(uri)).toBe(valid);
  });
  it('keeps the http:// form the publishers use, and names the common ones', () => {
    expect(canonicalRights('https://creativecommons.org/licenses/by/4.0/')).toBe(
      'http://creativecommons.org/licenses/by/4.0/',
    );
    expect(rightsLabel('http://rightsstatements.org/vocab/InC/1.0/')).toBe('In Copyright');
    expect(rightsLabel('https://creativecommons.org/licenses/by-nc-sa/3.0/de/')).toBe('CC BY-NC-SA 3.0 (de)');
  });
});
