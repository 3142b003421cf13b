// What other features may use of the shop's duty rules: they import it from here, never from the files inside.
export { getDutyRules } from './service';
