// The repair report: its model, the PDF drawn from it, and its route.
export { reportPdf } from './service';
export { renderReportPdf } from './pdf';
export { reportRoutes } from './routes';
