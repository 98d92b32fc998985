//! Double-double arithmetic (about 32 significant digits), for the few loops
//! whose cancellations double precision cannot carry: the incomplete-beta
//! continued fraction when one shape is huge. The error-free transformations are
//! Knuth's two-sum and the fused-multiply-add two-product (Dekker 1971; see
//! J.-M. Muller et al., *Handbook of Floating-Point Arithmetic*, 2nd ed., ch. 4).

use std::ops::{Add, Div, Mul, Sub};

/// An unevaluated sum hi + lo with |lo| ≤ ulp(hi)/2.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Dd {
    /// Leading part.
    pub hi: f64,
    /// Trailing correction.
    pub lo: f64,
}

fn two_sum(a: f64, b: f64) -> (f64, f64) {
    let s = a + b;
    let bb = s - a;
    (s, (a - (s - bb)) + (b - bb))
}

fn quick_two_sum(a: f64, b: f64) -> (f64, f64) {
    let s = a + b;
    (s, b - (s - a))
}

impl Dd {
    /// The exact value of one double.
    pub fn new(x: f64) -> Self {
        Self { hi: x, lo: 0.0 }
    }

    /// The nearest double.
    pub fn to_f64(self) -> f64 {
        self.hi + self.lo
    }

    /// |self| as a double, for convergence tests.
    pub fn abs_f64(self) -> f64 {
        self.to_f64().abs()
    }
}

impl Add for Dd {
    type Output = Dd;
    fn add(self, o: Dd) -> Dd {
        let (s, e) = two_sum(self.hi, o.hi);
        let (t, f) = two_sum(self.lo, o.lo);
        let (s, e) = quick_two_sum(s, e + t);
        let (hi, lo) = quick_two_sum(s, e + f);
        Dd { hi, lo }
    }
}

impl Sub for Dd {
    type Output = Dd;
    fn sub(self, o: Dd) -> Dd {
        self + Dd {
            hi: -o.hi,
            lo: -o.lo,
        }
    }
}

impl Mul for Dd {
    type Output = Dd;
    fn mul(self, o: Dd) -> Dd {
        let p = self.hi * o.hi;
        let e = self.hi.mul_add(o.hi, -p);
        let (hi, lo) = quick_two_sum(p, e + (self.hi * o.lo + self.lo * o.hi));
        Dd { hi, lo }
    }
}

impl Div for Dd {
    type Output = Dd;
    fn div(self, o: Dd) -> Dd {
        // One Newton correction of the double quotient.
        let q1 = self.hi / o.hi;
        let r = self - o * Dd::new(q1);
        let q2 = r.hi / o.hi;
        let r = r - o * Dd::new(q2);
        let q3 = r.hi / o.hi;
        let (hi, lo) = quick_two_sum(q1, q2);
        Dd { hi, lo } + Dd::new(q3)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn keeps_digits_a_double_drops() {
        // (1 + 2^-60) − 1 is 2^-60 exactly in double-double, 0 in double.
        let tiny = 2f64.powi(-60);
        let x = Dd::new(1.0) + Dd::new(tiny);
        assert_eq!((x - Dd::new(1.0)).to_f64(), tiny);
        let third = Dd::new(1.0) / Dd::new(3.0);
        let back = third * Dd::new(3.0) - Dd::new(1.0);
        assert!(back.to_f64().abs() < 1e-30);
    }
}
