/**
 * The optional horn tone (Web Audio), off by default: a soft two-tone square wave while any horn
 * on the panel sounds and the student has switched sound on. Nothing plays without a user gesture.
 */
import { onBeforeUnmount, ref, watch, type Ref } from 'vue';

export function useHornSound(sounding: Ref<boolean>) {
  const enabled = ref(false);
  let context: AudioContext | null = null;
  let oscillator: OscillatorNode | null = null;
  let lfo: OscillatorNode | null = null;

  const stop = (): void => {
    oscillator?.stop();
    lfo?.stop();
    oscillator = null;
    lfo = null;
  };

  const start = (): void => {
    if (oscillator !== null || typeof AudioContext === 'undefined') return;
    context ??= new AudioContext();
    const gain = context.createGain();
    gain.gain.value = 0.04;
    oscillator = context.createOscillator();
    oscillator.type = 'square';
    oscillator.frequency.value = 520;
    // A slow square LFO on the pitch makes the two-tone warble of a warning horn.
    lfo = context.createOscillator();
    lfo.type = 'square';
    lfo.frequency.value = 2;
    const depth = context.createGain();
    depth.gain.value = 80;
    lfo.connect(depth).connect(oscillator.frequency);
    oscillator.connect(gain).connect(context.destination);
    oscillator.start();
    lfo.start();
  };

  watch([enabled, sounding], ([on, horn]) => (on && horn ? start() : stop()));
  onBeforeUnmount(() => {
    stop();
    void context?.close();
  });
  return { enabled };
}
