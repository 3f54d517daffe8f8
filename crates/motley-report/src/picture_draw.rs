//! Drawing a [`Picture`]: an SVG of colored paths for grids up to [`SVG_LIMIT`] vertices a side, and for
//! larger grids a PNG of the whole grid plus an SVG of its lower-left corner.
//!
//! # Design
//! The SVG is written by hand rather than through plotters: all edges of one color go into a single
//! `<path>`, which keeps an 80 × 80 picture near a hundred kilobytes instead of one element per edge.
//! In the PNG each vertex is an `s × s` block of pixels (`s` even) split into quadrants: bottom-left is
//! the vertex, bottom-right the edge leaving it to the right, top-left the edge leaving it upward,
//! top-right background; a strip along the left and bottom edges shows the boundary colors. Paths are
//! then unbroken chains of pixels. Grids wider or taller than [`PNG_LIMIT`] are cut to their lower-left
//! corner, which the caption says.

use std::collections::BTreeMap;
use std::fmt::Write as _;
use std::path::Path;

use motley_scenario::picture::Picture;

use crate::error::ReportError;
use crate::palette::{self, Rgb};

/// Largest width and height drawn whole as SVG.
pub const SVG_LIMIT: usize = 80;
/// Largest width and height drawn into the PNG; beyond it the lower-left corner of this size.
pub const PNG_LIMIT: usize = 2048;
/// Target side of the PNG in pixels, for choosing the block size.
const PNG_TARGET: usize = 1600;

/// A drawn picture: files relative to the report folder and a caption.
#[derive(Debug, Clone, PartialEq, Eq)]
pub(crate) struct DrawnPicture {
    /// Relative paths of the image files, the main one first.
    pub files: Vec<String>,
    /// What the files show.
    pub caption: String,
}

/// Draws `pic` into `figures/` under `report_dir`, with `caption` describing the sample.
pub(crate) fn draw(
    pic: &Picture,
    report_dir: &Path,
    caption: &str,
) -> Result<DrawnPicture, ReportError> {
    let (w, h) = (pic.width, pic.height);
    if w <= SVG_LIMIT && h <= SVG_LIMIT {
        let rel = "figures/sample.svg".to_string();
        let svg = svg(pic, w, h, caption);
        crate::atomic::write_synced(&report_dir.join(&rel), svg.as_bytes())?;
        return Ok(DrawnPicture {
            files: vec![rel],
            caption: format!("{caption} ({w} × {h} vertices)."),
        });
    }
    let (pw, ph) = (w.min(PNG_LIMIT), h.min(PNG_LIMIT));
    let png_rel = "figures/sample.png".to_string();
    let png_path = report_dir.join(&png_rel);
    let bytes = png(pic, pw, ph, &png_path)?;
    crate::atomic::write_synced(&png_path, &bytes)?;
    let (cw, ch) = (w.min(SVG_LIMIT), h.min(SVG_LIMIT));
    let corner_rel = "figures/sample-corner.svg".to_string();
    let corner_caption = format!("{caption}: lower-left {cw} × {ch} corner of the {w} × {h} grid");
    let corner = svg(pic, cw, ch, &corner_caption);
    crate::atomic::write_synced(&report_dir.join(&corner_rel), corner.as_bytes())?;
    let whole = if (pw, ph) == (w, h) {
        format!("the whole {w} × {h} grid")
    } else {
        format!("the lower-left {pw} × {ph} corner of the {w} × {h} grid")
    };
    Ok(DrawnPicture {
        files: vec![png_rel, corner_rel],
        caption: format!(
            "{caption}. PNG: {whole}, one block of pixels per vertex; \
             SVG: the lower-left {cw} × {ch} corner."
        ),
    })
}

/// SVG of the window `0..cols` × `0..rows` of `pic` (window starts at the lower-left corner).
pub(crate) fn svg(pic: &Picture, cols: usize, rows: usize, caption: &str) -> String {
    let span = cols.max(rows) + 1;
    let cell = (640 / span).clamp(6, 60) as f64;
    let (top, bottom) = (56.0, 96.0);
    let grid_w = (cols + 1) as f64 * cell;
    let grid_h = (rows + 1) as f64 * cell;
    // At least wide enough for the title and the color bar; the grid is centred.
    let width = (56.0 + grid_w + 24.0).max(560.0);
    let left = ((width - grid_w) / 2.0).max(56.0);
    let height = top + grid_h + bottom;
    // Vertex (x, y) sits at (px(x), py(y)); boundary edges reach one cell beyond the outer vertices.
    let px = |x: f64| left + (x + 1.0) * cell;
    let py = |y: f64| top + (rows as f64 - y) * cell;

    // Path data per color, 0 (empty edges) first thanks to the ordered map.
    let mut paths: BTreeMap<u32, String> = BTreeMap::new();
    let mut seg = |c: u32, x0: f64, y0: f64, x1: f64, y1: f64| {
        let d = paths.entry(c).or_default();
        let _ = write!(d, "M{x0:.1} {y0:.1}L{x1:.1} {y1:.1}");
    };
    for y in 0..rows {
        for x in 0..cols {
            let (vx, vy) = (px(x as f64), py(y as f64));
            seg(pic.in_left(x, y), vx - cell, vy, vx, vy);
            seg(pic.in_bottom(x, y), vx, vy + cell, vx, vy);
            let i = y * pic.width + x;
            if x + 1 == cols {
                seg(pic.right_out[i], vx, vy, vx + cell, vy);
            }
            if y + 1 == rows {
                seg(pic.up_out[i], vx, vy, vx, vy - cell);
            }
        }
    }

    let ink = palette::hex(palette::INK);
    let mut s = String::new();
    let _ = writeln!(
        s,
        r#"<svg xmlns="http://www.w3.org/2000/svg" width="{width:.0}" height="{height:.0}" viewBox="0 0 {width:.0} {height:.0}" font-family="sans-serif">"#
    );
    let _ = writeln!(s, r#"<rect width="100%" height="100%" fill="white"/>"#);
    let _ = writeln!(
        s,
        r#"<text x="{:.1}" y="30" text-anchor="middle" font-size="18" fill="{ink}">Sample configuration: colored paths on the {} × {} grid</text>"#,
        width / 2.0,
        pic.width,
        pic.height
    );
    let stroke = (cell * 0.3).clamp(1.5, 6.0);
    for (c, d) in &paths {
        if *c == 0 {
            let _ = writeln!(
                s,
                r#"<path d="{d}" stroke="{}" stroke-width="1" fill="none"/>"#,
                palette::hex(palette::FAINT)
            );
        } else {
            let _ = writeln!(
                s,
                r#"<path d="{d}" stroke="{}" stroke-width="{stroke:.1}" stroke-linecap="round" fill="none"><title>color {c}</title></path>"#,
                palette::hex(palette::path_color(*c, pic.max_color))
            );
        }
    }
    // Axis labels: first and last column and row, and what the axes are.
    let _ = writeln!(
        s,
        r#"<text x="{:.1}" y="{:.1}" text-anchor="middle" font-size="12" fill="{ink}">0</text>"#,
        px(0.0),
        py(0.0) + cell + 16.0
    );
    let _ = writeln!(
        s,
        r#"<text x="{:.1}" y="{:.1}" text-anchor="middle" font-size="12" fill="{ink}">{}</text>"#,
        px((cols - 1) as f64),
        py(0.0) + cell + 16.0,
        cols - 1
    );
    let _ = writeln!(
        s,
        r#"<text x="{:.1}" y="{:.1}" text-anchor="end" font-size="12" fill="{ink}" dy="0.35em">0</text>"#,
        left - 4.0,
        py(0.0)
    );
    let _ = writeln!(
        s,
        r#"<text x="{:.1}" y="{:.1}" text-anchor="end" font-size="12" fill="{ink}" dy="0.35em">{}</text>"#,
        left - 4.0,
        py((rows - 1) as f64),
        rows - 1
    );
    let _ = writeln!(
        s,
        r#"<text x="{:.1}" y="{:.1}" text-anchor="middle" font-size="14" fill="{ink}">column x</text>"#,
        left + grid_w / 2.0,
        top + grid_h + 34.0
    );
    let (ly, lx) = (top + grid_h / 2.0, (left - 36.0).max(16.0));
    let _ = writeln!(
        s,
        r#"<text x="{lx:.1}" y="{ly:.1}" text-anchor="middle" font-size="14" fill="{ink}" transform="rotate(-90 {lx:.1} {ly:.1})">row y (from the bottom)</text>"#
    );
    // Color bar.
    let bar_y = top + grid_h + 48.0;
    let bar_w = (grid_w * 0.6).max(120.0);
    let bar_x = left + (grid_w - bar_w) / 2.0;
    let _ = writeln!(
        s,
        r#"<defs><linearGradient id="paths" x1="0" x2="1" y1="0" y2="0">"#
    );
    for k in 0..=10 {
        let t = k as f64 / 10.0;
        let _ = writeln!(
            s,
            r#"<stop offset="{t:.1}" stop-color="{}"/>"#,
            palette::hex(palette::scale(t))
        );
    }
    let _ = writeln!(s, "</linearGradient></defs>");
    let _ = writeln!(
        s,
        r#"<rect x="{bar_x:.1}" y="{bar_y:.1}" width="{bar_w:.1}" height="10" fill="url(#paths)"/>"#
    );
    let _ = writeln!(
        s,
        r#"<text x="{:.1}" y="{:.1}" text-anchor="end" font-size="12" fill="{ink}" dy="0.8em">color 1</text>"#,
        bar_x - 6.0,
        bar_y
    );
    let _ = writeln!(
        s,
        r#"<text x="{:.1}" y="{:.1}" text-anchor="start" font-size="12" fill="{ink}" dy="0.8em">color {}</text>"#,
        bar_x + bar_w + 6.0,
        bar_y,
        pic.max_color.max(1)
    );
    let _ = writeln!(
        s,
        r#"<text x="{:.1}" y="{:.1}" text-anchor="middle" font-size="12" fill="{ink}">{}</text>"#,
        width / 2.0,
        bar_y + 34.0,
        xml_escape(caption)
    );
    s.push_str("</svg>\n");
    s
}

/// Escapes text for SVG content.
pub(crate) fn xml_escape(text: &str) -> String {
    let mut out = String::with_capacity(text.len());
    for c in text.chars() {
        match c {
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '&' => out.push_str("&amp;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&apos;"),
            other => out.push(other),
        }
    }
    out
}

/// Pixels per vertex for a grid of `cols × rows`: even, at least 2, at most 8.
fn block(cols: usize, rows: usize) -> usize {
    let per = PNG_TARGET / cols.max(rows).max(1);
    (per / 2).clamp(1, 4) * 2
}

/// RGB pixels (rows top to bottom) and size of the window `0..cols` × `0..rows` of `pic`.
pub(crate) fn pixels(pic: &Picture, cols: usize, rows: usize) -> (Vec<u8>, usize, usize) {
    let s = block(cols, rows);
    let q = s / 2;
    // A strip of one quadrant along the left and bottom shows the boundary colors.
    let (iw, ih) = (cols * s + q, rows * s + q);
    let mut img = vec![255u8; iw * ih * 3];
    let colour =
        |c: u32| -> Option<Rgb> { (c != 0).then(|| palette::path_color(c, pic.max_color)) };
    let mut fill = |x0: usize, y0_from_bottom: usize, c: Option<Rgb>| {
        let Some((r, g, b)) = c else { return };
        for dy in 0..q {
            let row = ih - 1 - (y0_from_bottom + dy);
            for dx in 0..q {
                let at = (row * iw + x0 + dx) * 3;
                img[at] = r;
                img[at + 1] = g;
                img[at + 2] = b;
            }
        }
    };
    for y in 0..rows {
        // Left boundary strip, at the height of the vertex quadrant.
        fill(0, q + y * s, colour(pic.left[y]));
    }
    for x in 0..cols {
        fill(q + x * s, 0, colour(pic.bottom[x]));
    }
    for y in 0..rows {
        for x in 0..cols {
            let i = y * pic.width + x;
            let (r, u) = (pic.right_out[i], pic.up_out[i]);
            let (bx, by) = (q + x * s, q + y * s);
            fill(bx, by, colour(r.max(u)));
            fill(bx + q, by, colour(r));
            fill(bx, by + q, colour(u));
        }
    }
    (img, iw, ih)
}

/// PNG bytes of the window `0..cols` × `0..rows`; `path` only names the file in errors.
fn png(pic: &Picture, cols: usize, rows: usize, path: &Path) -> Result<Vec<u8>, ReportError> {
    let (img, iw, ih) = pixels(pic, cols, rows);
    let err = |e: png::EncodingError| ReportError::Png {
        path: path.to_path_buf(),
        message: e.to_string(),
    };
    let mut out = Vec::new();
    {
        let mut enc = png::Encoder::new(&mut out, iw as u32, ih as u32);
        enc.set_color(png::ColorType::Rgb);
        enc.set_depth(png::BitDepth::Eight);
        let mut writer = enc.write_header().map_err(err)?;
        writer.write_image_data(&img).map_err(err)?;
        writer.finish().map_err(err)?;
    }
    Ok(out)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A 3 × 2 grid with colors entering left (rows 0, 1 → colors 1, 2) and bottom (columns → 3, 0, 4),
    /// routed by hand: every vertex passes on what it receives.
    fn small() -> Picture {
        // Row 0: (0,0) gets left 1, bottom 3 -> right 1, up 3.
        //        (1,0) gets left 1, bottom 0 -> right 0, up 1.
        //        (2,0) gets left 0, bottom 4 -> right 4, up 0.
        // Row 1: (0,1) gets left 2, below 3 -> right 3, up 2.
        //        (1,1) gets left 3, below 1 -> right 1, up 3.
        //        (2,1) gets left 1, below 0 -> right 0, up 1.
        let p = Picture {
            width: 3,
            height: 2,
            max_color: 4,
            left: vec![1, 2],
            bottom: vec![3, 0, 4],
            right_out: vec![1, 0, 4, 3, 1, 0],
            up_out: vec![3, 1, 0, 2, 3, 1],
        };
        p.validate().unwrap();
        p
    }

    #[test]
    fn svg_has_one_path_per_color_and_labels() {
        let s = svg(&small(), 3, 2, "one sample & more");
        assert!(s.starts_with("<svg"));
        assert!(s.trim_end().ends_with("</svg>"));
        // Colors 1..=4 each appear, plus the faint empty edges.
        for c in 1..=4 {
            assert_eq!(s.matches(&format!("<title>color {c}</title>")).count(), 1);
        }
        assert_eq!(s.matches("<path").count(), 5);
        assert!(s.contains("column x"));
        assert!(s.contains("row y (from the bottom)"));
        assert!(s.contains("one sample &amp; more"));
    }

    #[test]
    fn svg_draws_every_edge_once() {
        // A W × H window has H·(W+1) horizontal and W·(H+1) vertical edges.
        let s = svg(&small(), 3, 2, "");
        let moves: usize = s
            .split("d=\"")
            .skip(1)
            .map(|rest| rest.split('"').next().unwrap().matches('M').count())
            .sum();
        assert_eq!(moves, 2 * 4 + 3 * 3);
    }

    #[test]
    fn png_blocks_follow_the_paths() {
        let p = small();
        let (img, iw, ih) = pixels(&p, 3, 2);
        let s = block(3, 2);
        let q = s / 2;
        assert_eq!((iw, ih), (3 * s + q, 2 * s + q));
        let at = |px: usize, py_from_bottom: usize| {
            let row = ih - 1 - py_from_bottom;
            let k = (row * iw + px) * 3;
            (img[k], img[k + 1], img[k + 2])
        };
        // Right-edge quadrant of vertex (0, 0) carries color 1; up quadrant carries color 3.
        assert_eq!(at(q + q, q), palette::path_color(1, 4));
        assert_eq!(at(q, q + q), palette::path_color(3, 4));
        // Vertex (1, 0) sends nothing right: white.
        assert_eq!(at(q + s + q, q), (255, 255, 255));
        // Bottom strip under column 2 shows color 4 entering.
        assert_eq!(at(q + 2 * s, 0), palette::path_color(4, 4));
    }

    #[test]
    fn large_picture_gets_png_and_corner_svg() {
        let n = SVG_LIMIT + 5;
        // Paths go straight: color y+1 enters row y from the left and runs right; nothing from below.
        let pic = Picture {
            width: n,
            height: n,
            max_color: n as u32,
            left: (1..=n as u32).collect(),
            bottom: vec![0; n],
            right_out: (0..n * n).map(|i| (i / n) as u32 + 1).collect(),
            up_out: vec![0; n * n],
        };
        pic.validate().unwrap();
        let dir = tempfile::tempdir().unwrap();
        std::fs::create_dir(dir.path().join("figures")).unwrap();
        let drawn = draw(&pic, dir.path(), "straight rows").unwrap();
        assert_eq!(
            drawn.files,
            vec!["figures/sample.png", "figures/sample-corner.svg"]
        );
        let png_bytes = std::fs::read(dir.path().join("figures/sample.png")).unwrap();
        assert_eq!(&png_bytes[..8], b"\x89PNG\r\n\x1a\n");
        let corner = std::fs::read_to_string(dir.path().join("figures/sample-corner.svg")).unwrap();
        assert!(corner.contains(&format!("lower-left {SVG_LIMIT} × {SVG_LIMIT} corner")));
        assert!(drawn.caption.contains("whole"));
    }
}
