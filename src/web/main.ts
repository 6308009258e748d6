/**
 * The web designer's entry: registers the elements; <lw-app> in index.html does the rest.
 * Everything heavy runs in the synthesis workers (worker.ts).
 */
import './elements/app.js';
