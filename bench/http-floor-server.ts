// What an Express stack like the API's (helmet, JSON body, cookies) allows on this machine when it
// answers 201 without touching a database: a reading write through Express could not be faster.
// Started by writes.bench.ts as a child process.
import express from 'express';
import helmet from 'helmet';
import cookieParser from 'cookie-parser';

const app = express();
app.use(helmet());
app.use(express.json({ limit: '100kb', strict: false }));
app.use(cookieParser());
app.post('/api/readings', (req, res) => {
  res.status(201).json({ id: (req.body as { id?: string }).id ?? null });
});
app.get('/api/health', (_req, res) => res.json({ status: 'ok' }));
app.listen(Number(process.env.PORT), '127.0.0.1');
