// Every job type registers itself on import.
import './tile-photo.ts';
import './fixity-check.ts';
