// What other features may use of quotes: they import it from here, never from the files inside.
export { quoteRoutes } from './routes';
