// libSQL cannot open a database file in a missing folder: make sure data/ exists.
import { mkdirSync } from 'node:fs';
mkdirSync('data', { recursive: true });
