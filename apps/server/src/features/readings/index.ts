// What other features may use of readings: they import it from here, never from the files inside.
export { createReading, findReadings } from './service';
