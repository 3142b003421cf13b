// What other features may use of shop-stats: they import it from here, never from the files inside.
export { shopStatsRoutes } from './routes';
