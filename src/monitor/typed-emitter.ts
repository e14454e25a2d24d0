/** A minimal typed event emitter: listeners keyed by event name, `on` returns an unsubscribe. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Listener = (...args: any[]) => void;

export class TypedEmitter<Events extends { [E in keyof Events]: Listener }> {
  private readonly listeners = new Map<keyof Events, Set<Listener>>();

  on<E extends keyof Events>(event: E, listener: Events[E]): () => void {
    let set = this.listeners.get(event);
    if (set === undefined) {
      set = new Set();
      this.listeners.set(event, set);
    }
    set.add(listener);
    return () => set.delete(listener);
  }

  emit<E extends keyof Events>(event: E, ...args: Parameters<Events[E]>): void {
    const set = this.listeners.get(event);
    if (set === undefined) return;
    for (const listener of [...set]) listener(...args);
  }
}
