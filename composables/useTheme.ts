/** Light or dark, following the device unless the person chose; kept in localStorage. */
export function useTheme() {
  const isDark = useDark({ selector: 'html', attribute: 'class', valueDark: 'dark', valueLight: '', storageKey: 'fw-theme' })
  const toggle = useToggle(isDark)
  return { isDark, toggle }
}
