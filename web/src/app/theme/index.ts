// Order matters: the base theme first, then our overrides (unlayered, so they win).
import 'primereact/resources/themes/saga-blue/theme.css';
import 'primeicons/primeicons.css';
import '@fontsource/public-sans/400.css';
import '@fontsource/public-sans/600.css';
import '@fontsource/public-sans/700.css';
import './theme.css';

export { applyTheme } from './apply-theme';
export { colours, fonts } from './tokens';
