// The Cramér-Rao bound on alpha and omega0 for one record in white Gaussian noise, from the Fisher
// information of the closed-form model itself (derived; no stored source), parametrised as the fit is.

import { inverse, Matrix } from 'ml-matrix';
import { quantity, type Quantity } from '../../../core/quantity';
import { responseAt, type ResponseParams } from '../../../core/response/secondOrder';

type Name = keyof ResponseParams;

/**
 * With samples before the event the fit has t0, yPre, yFinal, alpha, omega0, b free and a = yPre - yFinal
 * (continuous at the event); a record that starts at the event has yFinal, alpha, omega0, a, b free, t0 fixed.
 */
export function fisherBound(
  p: ResponseParams,
  time: ArrayLike<number>,
  sigma: number,
): { alpha: Quantity; omega0: Quantity; correlation: number } {
  const hasPre = time[0] < p.t0;
  const names: Name[] = hasPre ? ['t0', 'yPre', 'yFinal', 'alpha', 'omega0', 'b'] : ['yFinal', 'alpha', 'omega0', 'a', 'b'];
  const build = (values: number[]): ResponseParams => {
    const q: ResponseParams = { ...p };
    names.forEach((n, j) => (q[n] = values[j]));
    if (hasPre) q.a = q.yPre - q.yFinal;
    return q;
  };
  const centre = names.map((n) => p[n]);
  const typical = Math.max(Math.abs(p.a), Math.abs(p.yFinal - p.yPre), Math.abs(p.b) / p.omega0);
  const span = time[time.length - 1] - time[0];
  const steps = names.map((n, j) => {
    if (n === 't0') return span * 1e-7;
    if (n === 'alpha' || n === 'omega0') return p.omega0 * 1e-7;
    return (Math.abs(centre[j]) + (n === 'b' ? typical * p.omega0 : typical)) * 1e-7;
  });
  const rows: number[][] = [];
  for (let i = 0; i < time.length; i++) {
    if (!hasPre && time[i] < p.t0) continue;
    rows.push(
      names.map((_, j) => {
        const up = centre.slice();
        const down = centre.slice();
        up[j] += steps[j];
        down[j] -= steps[j];
        return (responseAt(build(up), time[i]) - responseAt(build(down), time[i])) / (2 * steps[j]);
      }),
    );
  }
  const jacobian = new Matrix(rows);
  const covariance = inverse(jacobian.transpose().mmul(jacobian)).mul(sigma * sigma);
  const ia = names.indexOf('alpha');
  const iw = names.indexOf('omega0');
  const sa = Math.sqrt(covariance.get(ia, ia));
  const sw = Math.sqrt(covariance.get(iw, iw));
  return {
    alpha: quantity(p.alpha, sa, 's^-1'),
    omega0: quantity(p.omega0, sw, 'rad/s'),
    correlation: covariance.get(ia, iw) / (sa * sw),
  };
}
