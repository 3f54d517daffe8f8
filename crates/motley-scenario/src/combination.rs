//! Observables combined from other observables of the same model, sample by sample: tuples of
//! numbers (a joint value), differences and sums of two numbers, and events comparing a number with
//! a constant or with another number.
//!
//! A combination is computed by one function, [`Combination::value`], from the numbers its
//! components take in one sample: Monte Carlo calls it on each sample's numbers, exact mode on each
//! outcome of the components' joint exact law, so both read the combination the same way.

use crate::family::Value;

/// How the components of a combined observable are combined (components are observable indices).
#[derive(Debug, Clone, PartialEq)]
pub enum Combination {
    /// The numbers of the components together.
    Tuple(Vec<usize>),
    /// The first number minus the second.
    Difference(usize, usize),
    /// The sum of two numbers.
    Sum(usize, usize),
    /// Whether a number stands in `relation` to the operand.
    Compare(usize, Relation, Operand),
}

/// A relation between two numbers.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Relation {
    /// `>`.
    GreaterThan,
    /// `<`.
    LessThan,
    /// `≥`.
    AtLeast,
    /// `≤`.
    AtMost,
    /// `=`.
    EqualTo,
}

impl Relation {
    /// Whether `a` stands in this relation to `b`.
    pub fn holds(self, a: f64, b: f64) -> bool {
        match self {
            Relation::GreaterThan => a > b,
            Relation::LessThan => a < b,
            Relation::AtLeast => a >= b,
            Relation::AtMost => a <= b,
            Relation::EqualTo => a == b,
        }
    }
}

/// The right side of a comparison.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Operand {
    /// A constant.
    Number(f64),
    /// Another number observable (an index).
    Observable(usize),
}

impl Combination {
    /// The observables it reads, in the order [`Combination::value`] takes their numbers.
    pub fn components(&self) -> Vec<usize> {
        match *self {
            Combination::Tuple(ref v) => v.clone(),
            Combination::Difference(a, b) | Combination::Sum(a, b) => vec![a, b],
            Combination::Compare(a, _, Operand::Observable(b)) => vec![a, b],
            Combination::Compare(a, _, Operand::Number(_)) => vec![a],
        }
    }

    /// The combined value from the components' numbers `x` (in [`Combination::components`] order),
    /// with the observable's own number map `number` (its shift, scale and base) applied to
    /// differences and sums; a tuple is written into `buf`.
    pub fn value<'b>(
        &self,
        x: &[f64],
        number: impl Fn(f64) -> f64,
        buf: &'b mut Vec<f64>,
    ) -> Value<'b> {
        match *self {
            Combination::Tuple(_) => {
                buf.clear();
                buf.extend_from_slice(x);
                Value::Tuple(buf)
            }
            Combination::Difference(..) => Value::Number(number(x[0] - x[1])),
            Combination::Sum(..) => Value::Number(number(x[0] + x[1])),
            Combination::Compare(_, r, Operand::Number(c)) => Value::Event(r.holds(x[0], c)),
            Combination::Compare(_, r, Operand::Observable(_)) => Value::Event(r.holds(x[0], x[1])),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn values() {
        let mut buf = Vec::new();
        let id = |v: f64| v;
        assert_eq!(
            Combination::Difference(0, 1).value(&[5.0, 7.0], id, &mut buf),
            Value::Number(-2.0)
        );
        assert_eq!(
            Combination::Sum(0, 1).value(&[5.0, 7.0], |v| v * 10.0, &mut buf),
            Value::Number(120.0)
        );
        let gt0 = Combination::Compare(0, Relation::GreaterThan, Operand::Number(0.0));
        assert_eq!(gt0.value(&[0.0], id, &mut buf), Value::Event(false));
        assert_eq!(gt0.value(&[0.5], id, &mut buf), Value::Event(true));
        let le = Combination::Compare(3, Relation::AtMost, Operand::Observable(4));
        assert_eq!(le.components(), vec![3, 4]);
        assert_eq!(le.value(&[2.0, 2.0], id, &mut buf), Value::Event(true));
        let t = Combination::Tuple(vec![2, 0]);
        assert_eq!(
            t.value(&[1.0, 3.0], id, &mut buf),
            Value::Tuple(&[1.0, 3.0])
        );
    }
}
