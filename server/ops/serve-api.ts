// The API alone (for `npm run dev`, restarted by tsx watch on every change).
import { startServer, stopOnSignals } from '../main';

startServer().then(
  (app) => stopOnSignals(app.stop),
  (e: unknown) => {
    console.error(e);
    process.exit(1);
  },
);
