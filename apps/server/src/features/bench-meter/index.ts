// What other features may use of the bench meter: they import it from here, never from the files inside.
export { benchMeterRoutes } from './routes';
