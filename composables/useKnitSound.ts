import { Howl } from 'howler'

export type KnitCue = 'change' | 'section' | 'end'

/**
 * The knit view's sounds (public/sounds, made by scripts/make-sounds.mjs) and the optional
 * spoken cue. Browsers only play sound after a tap, so the sounds load on the first one.
 * Nothing here may ever stop a step from being recorded: failures are swallowed.
 */
export function useKnitSound(settings: ReturnType<typeof useKnitSettings>) {
  let sounds: Record<KnitCue, Howl> | null = null

  function unlock() {
    if (sounds) return
    try {
      const make = (name: KnitCue) => new Howl({ src: [`/sounds/${name}.wav`], preload: true, volume: 0.9 })
      sounds = { change: make('change'), section: make('section'), end: make('end') }
    }
    catch { /* no audio on this device: the screen still shows every cue */ }
  }

  function say(text: string) {
    if (!settings.voice.value || typeof speechSynthesis === 'undefined') return
    speechSynthesis.cancel()
    speechSynthesis.speak(new SpeechSynthesisUtterance(text))
  }

  function play(cue: KnitCue, spoken?: string) {
    if (!settings.sound.value) return
    try {
      sounds?.[cue].play()
      if (spoken) say(spoken)
    }
    catch { /* as above */ }
  }

  return { unlock, play }
}
