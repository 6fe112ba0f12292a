// Loaded with --import: records every module URL the process resolves into $IMPORT_LOG.
import { register } from 'node:module';

register('./record-hooks.mjs', import.meta.url);
