//! A small SVG writer for the charts of report.html: shapes, text, linear
//! scales and tick values. Coordinates are written with one decimal so the
//! same input gives the same bytes.

use std::fmt::Write;

/// Text made safe for HTML and SVG, as content or inside a quoted attribute.
pub fn escape(text: &str) -> String {
    let mut out = String::with_capacity(text.len());
    for ch in text.chars() {
        match ch {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&#39;"),
            _ => out.push(ch),
        }
    }
    out
}

/// A coordinate with one decimal (and no `-0.0`).
fn at(v: f64) -> String {
    let text = format!("{:.1}", v);
    if text == "-0.0" {
        "0.0".into()
    } else {
        text
    }
}

/// A number for an axis or a label: thousands grouped, `decimals` places.
pub fn grouped(value: f64, decimals: usize) -> String {
    let text = super::money(value);
    let (whole, cents) = text.split_once('.').unwrap_or((&text, ""));
    if decimals == 0 {
        // money() rounds to cents; round the whole again for 0 decimals.
        let rounded = super::money(value.round());
        return rounded.split('.').next().unwrap_or(whole).to_string();
    }
    format!("{whole}.{}", &cents[..decimals.min(cents.len())])
}

/// Maps a domain interval linearly onto a range of pixels.
#[derive(Debug, Clone, Copy)]
pub struct Scale {
    pub d0: f64,
    pub d1: f64,
    pub r0: f64,
    pub r1: f64,
}

impl Scale {
    pub fn new(domain: (f64, f64), range: (f64, f64)) -> Scale {
        let (d0, mut d1) = domain;
        if (d1 - d0).abs() < 1e-12 {
            d1 = d0 + 1.0;
        }
        Scale {
            d0,
            d1,
            r0: range.0,
            r1: range.1,
        }
    }

    pub fn map(&self, v: f64) -> f64 {
        self.r0 + (v - self.d0) / (self.d1 - self.d0) * (self.r1 - self.r0)
    }
}

/// Round tick values covering [low, high] with about `count` steps:
/// steps of 1, 2 or 5 times a power of ten. Returns the ticks and the step.
pub fn ticks(low: f64, high: f64, count: usize) -> (Vec<f64>, f64) {
    let span = (high - low).max(1e-9);
    let raw = span / count.max(1) as f64;
    let power = 10f64.powf(raw.log10().floor());
    let step = [1.0, 2.0, 5.0, 10.0]
        .iter()
        .map(|m| m * power)
        .find(|s| *s >= raw)
        .unwrap_or(10.0 * power);
    let first = (low / step).floor() * step;
    let mut values = Vec::new();
    let mut k = 0;
    loop {
        let v = first + k as f64 * step;
        values.push(if v.abs() < step * 1e-9 { 0.0 } else { v });
        if v >= high - step * 1e-9 || k > 1000 {
            break;
        }
        k += 1;
    }
    (values, step)
}

/// Decimals that tick labels of this step need.
pub fn step_decimals(step: f64) -> usize {
    if step >= 1.0 {
        0
    } else {
        (-step.log10().floor()) as usize
    }
}

/// An SVG element being written.
pub struct Svg {
    out: String,
}

impl Svg {
    /// Starts an `<svg>` with a `data-chart` name, a view box and a title
    /// that screen readers (and tooltips) give.
    pub fn new(chart: &str, width: f64, height: f64, title: &str) -> Svg {
        let mut out = String::new();
        let _ = write!(
            out,
            "<svg data-chart=\"{}\" viewBox=\"0 0 {} {}\" width=\"{}\" height=\"{}\" role=\"img\" aria-label=\"{}\" font-size=\"12\">",
            escape(chart),
            at(width),
            at(height),
            at(width),
            at(height),
            escape(title)
        );
        let _ = write!(out, "<title>{}</title>", escape(title));
        Svg { out }
    }

    /// A rectangle; `tip` becomes a tooltip.
    pub fn rect(&mut self, x: f64, y: f64, w: f64, h: f64, style: &str, tip: Option<&str>) {
        let (w, h) = (w.max(0.0), h.max(0.0));
        let _ = write!(
            self.out,
            "<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" {style}",
            at(x),
            at(y),
            at(w),
            at(h)
        );
        match tip {
            Some(tip) => {
                let _ = write!(self.out, "><title>{}</title></rect>", escape(tip));
            }
            None => self.out.push_str("/>"),
        }
    }

    pub fn line(&mut self, x1: f64, y1: f64, x2: f64, y2: f64, style: &str) {
        let _ = write!(
            self.out,
            "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" {style}/>",
            at(x1),
            at(y1),
            at(x2),
            at(y2)
        );
    }

    /// A path through the points, unfilled.
    pub fn path(&mut self, points: &[(f64, f64)], style: &str) {
        if points.is_empty() {
            return;
        }
        let mut d = String::new();
        for (k, (x, y)) in points.iter().enumerate() {
            let _ = write!(
                d,
                "{}{},{}",
                if k == 0 { "M" } else { " L" },
                at(*x),
                at(*y)
            );
        }
        let _ = write!(self.out, "<path d=\"{d}\" fill=\"none\" {style}/>");
    }

    /// Text at a point; `anchor` is `start`, `middle` or `end`.
    pub fn text(&mut self, x: f64, y: f64, text: &str, anchor: &str, style: &str) {
        let _ = write!(
            self.out,
            "<text x=\"{}\" y=\"{}\" text-anchor=\"{anchor}\" {style}>{}</text>",
            at(x),
            at(y),
            escape(text)
        );
    }

    /// A legend entry: a swatch (`style` of a rect, or a line when
    /// `as_line`) and its label; returns the x after it.
    pub fn legend(&mut self, x: f64, y: f64, label: &str, style: &str, as_line: bool) -> f64 {
        if as_line {
            self.line(x, y - 4.0, x + 18.0, y - 4.0, style);
        } else {
            self.rect(x, y - 10.0, 12.0, 12.0, style, None);
        }
        let start = x + if as_line { 24.0 } else { 17.0 };
        self.text(start, y, label, "start", "fill=\"#333\"");
        // About 6.6 px per character at 12 px in a sans-serif face.
        start + 6.6 * label.chars().count() as f64 + 16.0
    }

    pub fn finish(mut self) -> String {
        self.out.push_str("</svg>");
        self.out
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn escape_covers_markup_and_quotes() {
        assert_eq!(
            escape("<a href=\"x\">&'</a>"),
            "&lt;a href=&quot;x&quot;&gt;&amp;&#39;&lt;/a&gt;"
        );
    }

    #[test]
    fn ticks_are_round_and_cover_the_range() {
        let (values, step) = ticks(0.0, 4730.0, 5);
        assert_eq!(step, 1000.0);
        assert_eq!(values.first(), Some(&0.0));
        assert_eq!(values.last(), Some(&5000.0));
        let (values, step) = ticks(-120.0, 380.0, 4);
        assert_eq!(step, 200.0);
        assert_eq!(values, vec![-200.0, 0.0, 200.0, 400.0]);
        assert_eq!(step_decimals(0.5), 1);
        assert_eq!(grouped(12345.678, 0), "12,346");
        assert_eq!(grouped(0.5, 1), "0.5");
    }
}
