import { IconButton } from '../../components/ui/Button.js';
import { MoonIcon, SunIcon } from '../../components/ui/icons.js';
import { setTheme, useTheme } from './theme.js';

export function ThemeToggle() {
  const theme = useTheme();
  const next = theme === 'dark' ? 'light' : 'dark';
  return (
    <IconButton label={`Switch to ${next} theme`} onClick={() => setTheme(next)}>
      {theme === 'dark' ? <SunIcon /> : <MoonIcon />}
    </IconButton>
  );
}
