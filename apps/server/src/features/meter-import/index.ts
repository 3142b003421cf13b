// What other features may use of meter-import: they import it from here, never from the files inside.
export { meterImportRoutes } from './routes';
