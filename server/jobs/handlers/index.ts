// Every job type registers itself on import.
import './ingest-photo.ts';
import './fixity-check.ts';
