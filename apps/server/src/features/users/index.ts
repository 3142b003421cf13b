// What other features may use of users: they import it from here, never from the files inside.
export { tokenHash, traineeGuidedLifted } from './service';
