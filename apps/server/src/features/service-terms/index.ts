// What other features may use of service-terms: they import it from here, never from the files inside.
export { getServiceTerms } from './service';
export { serviceTermsRoutes } from './routes';
