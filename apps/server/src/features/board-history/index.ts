// What other features may use of board-history: they import it from here, never from the files inside.
export { boardHistoryRoutes } from './routes';
