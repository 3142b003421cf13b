// What other features may use of customers: they import it from here, never from the files inside.
export { toCustomer } from './service';
