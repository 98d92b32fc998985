//! Small line, band and bar plots as inline SVG for the report: no plotting
//! crate, no fonts or scripts fetched, and the same look on screen and on
//! paper. Colours are the Okabe–Ito set, and every series also differs by
//! dash pattern so a grey print stays readable.

use std::fmt::Write as _;

/// Okabe–Ito colours, in the order series take them.
pub const COLOURS: [&str; 6] = [
    "#0072B2", "#D55E00", "#009E73", "#CC79A7", "#E69F00", "#56B4E9",
];
/// Dash patterns, in the same order.
const DASHES: [&str; 6] = ["", "7 4", "2 3", "9 3 2 3", "4 4", "1 2"];

/// One line.
#[derive(Clone, Debug)]
pub struct Series {
    /// Legend text.
    pub name: String,
    /// Points (x, y).
    pub points: Vec<[f64; 2]>,
    /// Drawn heavier (the result the reader should look at).
    pub bold: bool,
}

/// A shaded band between two curves over the same x.
#[derive(Clone, Debug)]
pub struct Band {
    /// Legend text.
    pub name: String,
    /// (x, lower, upper).
    pub points: Vec<[f64; 3]>,
}

/// A plot.
#[derive(Clone, Debug, Default)]
pub struct Plot {
    /// Accessible title.
    pub title: String,
    /// x-axis label.
    pub x_label: String,
    /// y-axis label.
    pub y_label: String,
    /// Lines.
    pub series: Vec<Series>,
    /// Bands (drawn under the lines).
    pub bands: Vec<Band>,
    /// Bars (x, height), for counts.
    pub bars: Vec<[f64; 2]>,
    /// Vertical marker lines (x, label).
    pub marks: Vec<(f64, String)>,
    /// Show x as 10^x (a log axis drawn on log10 values).
    pub log_x: bool,
}

const W: f64 = 640.0;
const H: f64 = 300.0;
const LEFT: f64 = 64.0;
const RIGHT: f64 = 16.0;
const TOP: f64 = 16.0;
const BOTTOM: f64 = 48.0;

/// Round tick values covering [lo, hi].
pub fn ticks(lo: f64, hi: f64, want: usize) -> Vec<f64> {
    if !(lo.is_finite() && hi.is_finite() && hi > lo) {
        return vec![lo];
    }
    let raw = (hi - lo) / want.max(1) as f64;
    let mag = 10f64.powf(raw.log10().floor());
    let step = [1.0, 2.0, 2.5, 5.0, 10.0]
        .iter()
        .map(|m| m * mag)
        .find(|s| *s >= raw)
        .unwrap_or(10.0 * mag);
    let first = (lo / step).ceil() as i64;
    let last = (hi / step).floor() as i64;
    (first..=last).map(|i| i as f64 * step).collect()
}

/// Ticks for a log axis drawn on log10 values: 1, 2 and 5 of each decade.
fn log_ticks(lo: f64, hi: f64) -> Vec<f64> {
    let mut out = Vec::new();
    for d in (lo.floor() as i32)..=(hi.ceil() as i32) {
        for m in [1.0_f64, 2.0, 5.0] {
            let t = d as f64 + m.log10();
            if t >= lo - 1e-9 && t <= hi + 1e-9 {
                out.push(t);
            }
        }
    }
    out
}

/// A tick label: up to 4 significant digits, no trailing zeros.
fn label(x: f64) -> String {
    if x == 0.0 {
        return "0".to_owned();
    }
    if x.abs() >= 1e5 || x.abs() < 1e-4 {
        return format!("{x:.1e}");
    }
    let digits = (3 - x.abs().log10().floor() as i32).clamp(0, 9) as usize;
    let s = format!("{x:.digits$}");
    if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_owned()
    } else {
        s
    }
}

/// Escapes text for SVG and HTML.
pub fn escape(s: &str) -> String {
    s.replace('&', "&amp;")
        .replace('<', "&lt;")
        .replace('>', "&gt;")
        .replace('"', "&quot;")
}

impl Plot {
    fn extent(&self) -> Option<((f64, f64), (f64, f64))> {
        let mut xs = Vec::new();
        let mut ys = vec![0.0_f64];
        for s in &self.series {
            for p in &s.points {
                xs.push(p[0]);
                ys.push(p[1]);
            }
        }
        for b in &self.bands {
            for p in &b.points {
                xs.push(p[0]);
                ys.push(p[1]);
                ys.push(p[2]);
            }
        }
        for b in &self.bars {
            xs.push(b[0] - 0.5);
            xs.push(b[0] + 0.5);
            ys.push(b[1]);
        }
        let finite = |v: &Vec<f64>| {
            v.iter()
                .copied()
                .filter(|x| x.is_finite())
                .collect::<Vec<_>>()
        };
        let (xs, ys) = (finite(&xs), finite(&ys));
        let x0 = xs.iter().copied().fold(f64::INFINITY, f64::min);
        let x1 = xs.iter().copied().fold(f64::NEG_INFINITY, f64::max);
        let mut y0 = ys.iter().copied().fold(f64::INFINITY, f64::min);
        let mut y1 = ys.iter().copied().fold(f64::NEG_INFINITY, f64::max);
        if !(x0.is_finite() && x1 > x0 && y0.is_finite() && y1.is_finite()) {
            return None;
        }
        // Bands and lines of a sweep need not start at zero.
        if self.bars.is_empty() && !self.bands.is_empty() {
            y0 = ys.iter().copied().skip(1).fold(f64::INFINITY, f64::min);
        }
        // A density unbounded at an end (a vague mixture part) would flatten
        // everything else: the heavy line sets the height, others are clipped.
        let bold = self
            .series
            .iter()
            .filter(|l| l.bold)
            .flat_map(|l| l.points.iter().map(|p| p[1]))
            .filter(|y| y.is_finite())
            .fold(f64::NEG_INFINITY, f64::max);
        if self.bars.is_empty() && self.bands.is_empty() && bold > 0.0 {
            y1 = y1.min(1.3 * bold);
        }
        if y1 <= y0 {
            y1 = y0 + 1.0;
        }
        let pad = 0.05 * (y1 - y0);
        let y0 = if y0 == 0.0 { 0.0 } else { y0 - pad };
        Some(((x0, x1), (y0, y1 + pad)))
    }

    /// The plot as an `<svg>` element.
    pub fn svg(&self) -> String {
        let Some(((x0, x1), (y0, y1))) = self.extent() else {
            return String::from("<p class=\"missing\">(nothing to plot)</p>");
        };
        let sx = |x: f64| LEFT + (x - x0) / (x1 - x0) * (W - LEFT - RIGHT);
        let sy = |y: f64| TOP + (y1 - y) / (y1 - y0) * (H - TOP - BOTTOM);
        let mut s = String::new();
        let _ = write!(
            s,
            "<svg class=\"plot\" viewBox=\"0 0 {W} {H}\" role=\"img\" aria-label=\"{}\">",
            escape(&self.title)
        );
        let _ = write!(s, "<title>{}</title>", escape(&self.title));
        // Grid and ticks.
        let xticks = if self.log_x {
            log_ticks(x0, x1)
        } else {
            ticks(x0, x1, 6)
        };
        for t in xticks {
            let x = sx(t);
            let text = if self.log_x {
                format!("×{}", label(10f64.powf(t)))
            } else {
                label(t)
            };
            let _ = write!(
                s,
                "<line class=\"grid\" x1=\"{x:.1}\" y1=\"{TOP}\" x2=\"{x:.1}\" y2=\"{:.1}\"/><text class=\"tick\" x=\"{x:.1}\" y=\"{:.1}\" text-anchor=\"middle\">{text}</text>",
                H - BOTTOM,
                H - BOTTOM + 16.0
            );
        }
        for t in ticks(y0, y1, 5) {
            let y = sy(t);
            let _ = write!(
                s,
                "<line class=\"grid\" x1=\"{LEFT}\" y1=\"{y:.1}\" x2=\"{:.1}\" y2=\"{y:.1}\"/><text class=\"tick\" x=\"{:.1}\" y=\"{:.1}\" text-anchor=\"end\">{}</text>",
                W - RIGHT,
                LEFT - 6.0,
                y + 4.0,
                label(t)
            );
        }
        let _ = write!(
            s,
            "<rect class=\"frame\" x=\"{LEFT}\" y=\"{TOP}\" width=\"{:.1}\" height=\"{:.1}\"/>",
            W - LEFT - RIGHT,
            H - TOP - BOTTOM
        );
        for b in &self.bars {
            let (l, r) = (sx(b[0] - 0.4), sx(b[0] + 0.4));
            let _ = write!(
                s,
                "<rect class=\"bar\" x=\"{l:.1}\" y=\"{:.1}\" width=\"{:.1}\" height=\"{:.1}\" fill=\"{}\"/>",
                sy(b[1]),
                (r - l).max(0.5),
                (sy(0.0) - sy(b[1])).max(0.0),
                COLOURS[0]
            );
        }
        for (i, b) in self.bands.iter().enumerate() {
            let c = COLOURS[(i + 1) % COLOURS.len()];
            let mut d = String::new();
            for (k, p) in b.points.iter().enumerate() {
                let _ = write!(
                    d,
                    "{}{:.1},{:.1} ",
                    if k == 0 { "M" } else { "L" },
                    sx(p[0]),
                    sy(p[2])
                );
            }
            for p in b.points.iter().rev() {
                let _ = write!(d, "L{:.1},{:.1} ", sx(p[0]), sy(p[1]));
            }
            let _ = write!(
                s,
                "<path d=\"{}Z\" fill=\"{c}\" fill-opacity=\"0.22\" stroke=\"none\"/>",
                d
            );
        }
        for (i, line) in self.series.iter().enumerate() {
            let pts: Vec<String> = line
                .points
                .iter()
                .filter(|p| p[0].is_finite() && p[1].is_finite())
                .map(|p| format!("{:.1},{:.1}", sx(p[0]), sy(p[1].clamp(y0, y1))))
                .collect();
            if pts.len() < 2 {
                continue;
            }
            let dash = DASHES[i % DASHES.len()];
            let _ = write!(
                s,
                "<polyline points=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"{}\"{}/>",
                pts.join(" "),
                COLOURS[i % COLOURS.len()],
                if line.bold { 3 } else { 2 },
                if dash.is_empty() {
                    String::new()
                } else {
                    format!(" stroke-dasharray=\"{dash}\"")
                }
            );
        }
        for (x, text) in &self.marks {
            if *x >= x0 && *x <= x1 {
                let _ = write!(
                    s,
                    "<line class=\"mark\" x1=\"{:.1}\" y1=\"{TOP}\" x2=\"{:.1}\" y2=\"{:.1}\"/><text class=\"tick\" x=\"{:.1}\" y=\"{:.1}\">{}</text>",
                    sx(*x),
                    sx(*x),
                    H - BOTTOM,
                    sx(*x) + 4.0,
                    TOP + 12.0,
                    escape(text)
                );
            }
        }
        let _ = write!(
            s,
            "<text class=\"axis\" x=\"{:.1}\" y=\"{:.1}\" text-anchor=\"middle\">{}</text>",
            LEFT + 0.5 * (W - LEFT - RIGHT),
            H - 8.0,
            escape(&self.x_label)
        );
        let _ = write!(
            s,
            "<text class=\"axis\" transform=\"translate(14,{:.1}) rotate(-90)\" text-anchor=\"middle\">{}</text>",
            TOP + 0.5 * (H - TOP - BOTTOM),
            escape(&self.y_label)
        );
        s.push_str("</svg>");
        // The legend sits below the plot as text, so it never hides a curve.
        let mut legend = String::new();
        for (i, b) in self.bands.iter().enumerate() {
            let _ = write!(
                legend,
                "<span><i style=\"background:{}66\"></i>{}</span>",
                COLOURS[(i + 1) % COLOURS.len()],
                escape(&b.name)
            );
        }
        for (i, l) in self.series.iter().enumerate() {
            let _ = write!(
                legend,
                "<span><svg width=\"28\" height=\"10\" aria-hidden=\"true\"><line x1=\"0\" y1=\"5\" x2=\"28\" y2=\"5\" stroke=\"{}\" stroke-width=\"{}\"{}/></svg>{}</span>",
                COLOURS[i % COLOURS.len()],
                if l.bold { 3 } else { 2 },
                if DASHES[i % DASHES.len()].is_empty() {
                    String::new()
                } else {
                    format!(" stroke-dasharray=\"{}\"", DASHES[i % DASHES.len()])
                },
                escape(&l.name)
            );
        }
        if legend.is_empty() {
            s
        } else {
            format!("<figure>{s}<figcaption class=\"legend\">{legend}</figcaption></figure>")
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ticks_are_round_and_inside() {
        assert_eq!(
            ticks(0.0, 1.0, 5),
            vec![0.0, 0.2, 0.4, 0.6000000000000001, 0.8, 1.0]
        );
        let t = ticks(37.1, 44.9, 6);
        assert!(t.iter().all(|x| *x >= 37.1 && *x <= 44.9));
        assert_eq!(t.first(), Some(&38.0));
    }

    #[test]
    fn text_is_escaped_and_an_empty_plot_says_so() {
        let p = Plot {
            title: "a < b & \"c\"".into(),
            ..Plot::default()
        };
        assert!(p.svg().contains("nothing to plot"));
        assert_eq!(escape("a < b & \"c\""), "a &lt; b &amp; &quot;c&quot;");
    }
}
