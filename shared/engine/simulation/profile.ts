/**
 * Input profiles sampled block by block: the measurand [Pa or m^3/s] at t = n / fs.
 */
import type { InputProfile } from '../../contracts/simulation';

export interface ProfileSampler {
  /** Writes the profile at samples first, first + 1, ... into out [Pa or m^3/s]. */
  fill(first: number, out: Float64Array): void;
}

/** The profile's value at time t [s]; the reference the block samplers follow. */
export function profileValue(profile: InputProfile, t: number): number {
  switch (profile.kind) {
    case 'constant':
      return profile.value;
    case 'sine':
      return profile.offset + profile.amplitude * Math.sin(2 * Math.PI * profile.frequency * t + (profile.phase * Math.PI) / 180);
    case 'step':
      return t < profile.time ? profile.base : profile.base + profile.height;
    case 'ramp':
      if (t <= profile.start) return profile.from;
      if (t >= profile.end) return profile.to;
      return profile.from + ((profile.to - profile.from) * (t - profile.start)) / (profile.end - profile.start);
    case 'piecewiseLinear': {
      const points = profile.points;
      if (t <= points[0][0]) return points[0][1];
      const last = points[points.length - 1];
      if (t >= last[0]) return last[1];
      let low = 0;
      let high = points.length - 1;
      while (high - low > 1) {
        const middle = (low + high) >> 1;
        if (points[middle][0] <= t) low = middle;
        else high = middle;
      }
      const [t0, v0] = points[low];
      const [t1, v1] = points[high];
      return v0 + ((v1 - v0) * (t - t0)) / (t1 - t0);
    }
  }
}

export function createProfileSampler(profile: InputProfile, sampleRate: number): ProfileSampler {
  const dt = 1 / sampleRate;
  switch (profile.kind) {
    case 'constant':
      return { fill: (_first, out) => out.fill(profile.value) };
    case 'sine': {
      // A rotation per sample, re-anchored with sin/cos at each block start so no error builds up.
      const step = 2 * Math.PI * profile.frequency * dt;
      const c = Math.cos(step);
      const s = Math.sin(step);
      const phase = (profile.phase * Math.PI) / 180;
      const { offset, amplitude } = profile;
      return {
        fill(first, out) {
          const angle = step * first + phase;
          let sine = Math.sin(angle);
          let cosine = Math.cos(angle);
          for (let n = 0; n < out.length; n++) {
            out[n] = offset + amplitude * sine;
            const next = sine * c + cosine * s;
            cosine = cosine * c - sine * s;
            sine = next;
          }
        },
      };
    }
    case 'step': {
      const stepIndex = Math.ceil(profile.time * sampleRate - 1e-9);
      const before = profile.base;
      const after = profile.base + profile.height;
      return {
        fill(first, out) {
          const split = Math.min(out.length, Math.max(0, stepIndex - first));
          out.fill(before, 0, split);
          out.fill(after, split);
        },
      };
    }
    case 'ramp':
    case 'piecewiseLinear': {
      const points: readonly (readonly [number, number])[] =
        profile.kind === 'ramp'
          ? [
              [profile.start, profile.from],
              [profile.end, profile.to],
            ]
          : profile.points;
      return {
        fill(first, out) {
          const last = points.length - 1;
          let segment = 0;
          while (segment <= last && points[segment][0] <= first * dt) segment++;
          for (let n = 0; n < out.length; n++) {
            const t = (first + n) * dt;
            while (segment <= last && points[segment][0] <= t) segment++;
            if (segment === 0) out[n] = points[0][1];
            else if (segment > last) out[n] = points[last][1];
            else {
              const a = points[segment - 1];
              const b = points[segment];
              out[n] = a[1] + ((b[1] - a[1]) * (t - a[0])) / (b[0] - a[0]);
            }
          }
        },
      };
    }
  }
}
