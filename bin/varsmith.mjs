#!/usr/bin/env node
// Varsmith command line: analyze, export, pull, simulate (see DEVELOPERS.md). Runs the TypeScript sources through tsx.
import { register } from 'tsx/esm/api';
register();
await import('../server/cli.ts');
