// The one source of "now" for services: every time a service writes comes from the clock it is given.

export interface Clock {
  now(): Date;
}

/** The machine's time. */
export const systemClock: Clock = { now: () => new Date() };

/** A clock that stays where it is set (the demo seed walks it through the story; tests pin it). */
export class FixedClock implements Clock {
  private at: number;

  constructor(at: Date | string | number) {
    this.at = new Date(at).getTime();
  }

  now(): Date {
    return new Date(this.at);
  }

  set(at: Date | string | number): this {
    this.at = new Date(at).getTime();
    return this;
  }

  /** Moves the clock on by some milliseconds. */
  advance(ms: number): this {
    this.at += ms;
    return this;
  }
}
