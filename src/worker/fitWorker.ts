/** Worker entry: exposes the thin core API over comlink. */
import { expose } from 'comlink';
import { createFitWorkerApi } from './fitWorkerApi';

expose(createFitWorkerApi());
