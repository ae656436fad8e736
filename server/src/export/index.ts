// The export and report commands, dispatched from main.ts.
export { runExport } from './run-export';
export { runReport } from './run-report';
