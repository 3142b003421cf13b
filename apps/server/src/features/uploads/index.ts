// What other features may use of uploads: they import it from here, never from the files inside.
export { storeUpload } from './service';
