//! Levenberg–Marquardt least squares (Moré, "The Levenberg–Marquardt
//! algorithm: implementation and theory", 1978) for the handful of
//! hyperparameters a prior has, with a forward-difference Jacobian. A step is
//! only taken if it lowers the objective, so the result is never worse than
//! the start; on a square system (as many judgments as free hyperparameters)
//! it is Newton's method and converges to the exact root.

/// Minimises Σ r_i(θ)² from `start`; returns (θ, objective).
pub fn minimize(residuals: &dyn Fn(&[f64]) -> Option<Vec<f64>>, start: &[f64]) -> (Vec<f64>, f64) {
    let objective =
        |t: &[f64]| residuals(t).map_or(f64::INFINITY, |r| r.iter().map(|x| x * x).sum::<f64>());
    let mut theta = start.to_vec();
    let mut best = objective(&theta);
    let mut lambda = 1e-3;
    let k = theta.len();
    for _ in 0..300 {
        if best < 1e-30 {
            break;
        }
        let Some(r) = residuals(&theta) else { break };
        // Central-difference Jacobian.
        let mut jac = vec![vec![0.0; k]; r.len()];
        for j in 0..k {
            let h = 1e-6 * theta[j].abs().max(1.0);
            let (mut up, mut dn) = (theta.clone(), theta.clone());
            up[j] += h;
            dn[j] -= h;
            let (Some(ru), Some(rd)) = (residuals(&up), residuals(&dn)) else {
                return (theta, best);
            };
            for i in 0..r.len() {
                jac[i][j] = (ru[i] - rd[i]) / (2.0 * h);
            }
        }
        let mut jtj = vec![vec![0.0; k]; k];
        let mut jtr = vec![0.0; k];
        for i in 0..r.len() {
            for a in 0..k {
                jtr[a] += jac[i][a] * r[i];
                for b in 0..k {
                    jtj[a][b] += jac[i][a] * jac[i][b];
                }
            }
        }
        let mut improved = false;
        for _ in 0..12 {
            let mut m = jtj.clone();
            for (a, row) in m.iter_mut().enumerate() {
                row[a] += lambda * jtj[a][a].max(1e-300);
            }
            let Some(step) = solve(m, jtr.iter().map(|x| -x).collect()) else {
                lambda *= 10.0;
                continue;
            };
            let trial: Vec<f64> = theta.iter().zip(&step).map(|(t, s)| t + s).collect();
            let value = objective(&trial);
            if value < best {
                let small = step
                    .iter()
                    .zip(&theta)
                    .all(|(s, t)| s.abs() <= 1e-15 * t.abs().max(1.0));
                theta = trial;
                let gain = best - value;
                best = value;
                lambda = (lambda / 10.0).max(1e-12);
                // Stop once a step gains less than 1e-12 of the objective: the
                // hyperparameters have then settled far below 1e-6 relative.
                improved = !(small || gain <= 1e-12 * best);
                break;
            }
            lambda *= 10.0;
            if lambda > 1e12 {
                break;
            }
        }
        if !improved {
            break;
        }
    }
    (theta, best)
}

/// Solves the small dense system m·x = b by Gaussian elimination with partial pivoting.
fn solve(mut m: Vec<Vec<f64>>, mut b: Vec<f64>) -> Option<Vec<f64>> {
    let n = b.len();
    for col in 0..n {
        let piv = (col..n).max_by(|&i, &j| m[i][col].abs().total_cmp(&m[j][col].abs()))?;
        if m[piv][col].abs() < 1e-300 || !m[piv][col].is_finite() {
            return None;
        }
        m.swap(col, piv);
        b.swap(col, piv);
        let pivot_row = m[col].clone();
        for row in col + 1..n {
            let f = m[row][col] / pivot_row[col];
            for (x, p) in m[row].iter_mut().zip(&pivot_row).skip(col) {
                *x -= f * p;
            }
            b[row] -= f * b[col];
        }
    }
    let mut x = vec![0.0; n];
    for row in (0..n).rev() {
        let s: f64 = (row + 1..n).map(|c| m[row][c] * x[c]).sum();
        x[row] = (b[row] - s) / m[row][row];
    }
    x.iter().all(|v| v.is_finite()).then_some(x)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn finds_the_rosenbrock_minimum_and_exact_roots() {
        let r = |t: &[f64]| Some(vec![10.0 * (t[1] - t[0] * t[0]), 1.0 - t[0]]);
        let (t, v) = minimize(&r, &[-1.2, 1.0]);
        assert!((t[0] - 1.0).abs() < 1e-8 && (t[1] - 1.0).abs() < 1e-8 && v < 1e-20);
        // Square system: x² = 2, x·y = 3.
        let r = |t: &[f64]| Some(vec![t[0] * t[0] - 2.0, t[0] * t[1] - 3.0]);
        let (t, _) = minimize(&r, &[1.0, 1.0]);
        assert!((t[0] - 2f64.sqrt()).abs() < 1e-14 && (t[1] - 3.0 / 2f64.sqrt()).abs() < 1e-13);
    }
}
