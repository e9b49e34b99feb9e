// A play/pause clock for the pacer: time advances by performance.now() deltas times
// the speed on each animation frame, so a slow frame never loses or gains time.
export function usePacerClock(duration: () => number) {
  const elapsed = ref(0)
  const state = ref<'idle' | 'playing' | 'paused' | 'finished'>('idle')
  const speed = ref(1)
  let frame = 0
  let last = 0

  function loop(now: number) {
    elapsed.value = Math.min(duration(), elapsed.value + ((now - last) / 1000) * speed.value)
    last = now
    if (elapsed.value >= duration()) {
      state.value = 'finished'
      return
    }
    frame = requestAnimationFrame(loop)
  }
  function play() {
    if (state.value === 'playing' || duration() <= 0) return
    if (state.value === 'finished') elapsed.value = 0
    state.value = 'playing'
    last = performance.now()
    frame = requestAnimationFrame(loop)
  }
  function pause() {
    if (state.value !== 'playing') return
    cancelAnimationFrame(frame)
    state.value = 'paused'
  }
  function seek(to: number) {
    elapsed.value = Math.max(0, Math.min(duration(), to))
    last = performance.now()
    if (elapsed.value >= duration()) {
      cancelAnimationFrame(frame)
      state.value = 'finished'
    }
  }
  function reset() {
    cancelAnimationFrame(frame)
    elapsed.value = 0
    state.value = 'idle'
  }
  onBeforeUnmount(() => cancelAnimationFrame(frame))
  return { elapsed, state, speed, play, pause, seek, reset }
}
