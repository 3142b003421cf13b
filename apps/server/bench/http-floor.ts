// The floor under the write figures: the binding HTTP stack (Express 5, helmet, the JSON body parser) answering a
// reading-sized POST with 201 and doing nothing else. What the real write path costs above this is ours.
import express from 'express';
import helmet from 'helmet';

const app = express();
app.disable('x-powered-by');
app.use(helmet());
app.use(express.json({ limit: '1mb' }));
app.post('/api/jobs/:id/readings', (req, res) => {
  res
    .status(201)
    .set('Content-Type', 'application/json; charset=utf-8')
    .end(JSON.stringify({ jobId: req.params.id, ...(req.body as object) }));
});
const server = app.listen(Number(process.env.PORT), '127.0.0.1', () => console.log('listening'));
process.on('SIGTERM', () => server.close(() => process.exit(0)));
