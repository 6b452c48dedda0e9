/** Light or dark, following the device unless the person chose; kept in localStorage. */
export function useTheme() {
  const isDark = useDark({
    selector: 'html', attribute: 'class', valueDark: 'dark', valueLight: '', storageKey: 'fw-theme',
    // Only touch <html> when the theme really changes. The default handler swaps the class
    // behind a forced style recalculation of the whole page (to stop colour transitions) every
    // time a component calls this, and the shell already set the class before the first paint.
    onChanged: (dark, applyTheme, mode) => {
      if (document.documentElement.classList.contains('dark') !== dark) applyTheme(mode)
    },
  })
  const toggle = useToggle(isDark)
  return { isDark, toggle }
}
