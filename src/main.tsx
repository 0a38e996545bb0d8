// The page's first script, kept small: it starts the first requests (earlyStart.ts), then loads the app.
import '@fontsource/ibm-plex-sans/400.css';
import '@fontsource/ibm-plex-sans/500.css';
import '@fontsource/ibm-plex-sans/600.css';
import '@fontsource/roboto-mono/400.css';
import '@fontsource/roboto-mono/500.css';
import './styles.css';
import { startEarly } from './app/earlyStart.js';

startEarly(window.location.pathname);
void import('./app/start.js');
