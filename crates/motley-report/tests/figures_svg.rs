//! The figures: which files each claim gets, and that every SVG is well-formed with titles, axis
//! labels and legends.

use crate::common;

use std::fs;

use motley_report::{write_report, ReportExtras};

#[test]
fn each_claim_gets_the_figures_its_data_allows() {
    let tmp = tempfile::tempdir().unwrap();
    let dir = tmp.path().join("rep");
    let extras = ReportExtras::new("", vec![]).with_picture(common::picture(), "");
    write_report(&dir, &common::full(), &extras, false).unwrap();
    let mut names: Vec<String> = fs::read_dir(dir.join("figures"))
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect();
    names.sort();
    assert_eq!(
        names,
        [
            "near-miss-ecdf.svg",
            "near-miss-inclusion.svg",
            "near-miss-size-law.svg",
            "rainbow-top-ecdf.svg",
            "rainbow-top-inclusion.svg",
            "rainbow-top-size-law.svg",
            "sample.svg",
            "second-class-ecdf.svg",
            "swap-probabilities.svg",
        ]
    );
}

#[test]
fn no_figure_folder_without_figures() {
    let tmp = tempfile::tempdir().unwrap();
    let dir = tmp.path().join("rep");
    write_report(
        &dir,
        &common::run(vec![common::describe("corner")]),
        &ReportExtras::default(),
        false,
    )
    .unwrap();
    assert!(!dir.join("figures").exists());
    let md = fs::read_to_string(dir.join("summary.md")).unwrap();
    assert!(!md.contains("### Figures"));
}

#[test]
fn svgs_are_well_formed_and_labelled() {
    let tmp = tempfile::tempdir().unwrap();
    let dir = tmp.path().join("rep");
    let extras = ReportExtras::new("", vec![]).with_picture(common::picture(), "");
    write_report(&dir, &common::full(), &extras, false).unwrap();
    let expect: [(&str, &[&str]); 6] = [
        (
            "rainbow-top-ecdf.svg",
            &[
                "rainbow-top: empirical CDF",
                "value x",
                "P(X ≤ x)",
                "top-exits",
                "transposed-occupation",
            ],
        ),
        (
            "rainbow-top-inclusion.svg",
            // The second inclusion series has no label: the observable's name stands in.
            &[
                "per-element inclusion probability",
                "element",
                "P(element in the set)",
                "transposed-occupation",
            ],
        ),
        (
            "rainbow-top-size-law.svg",
            &["law of the set size", "set size k", "P(size = k)"],
        ),
        (
            "second-class-ecdf.svg",
            &[
                "empirical CDF against the reference",
                "density profile tail",
                "exact law",
            ],
        ),
        (
            "swap-probabilities.svg",
            &["event probabilities", "probability", ">\nt\n<", "limit 2/3"],
        ),
        (
            "sample.svg",
            &[
                "colored paths on the 2 × 2 grid",
                "column x",
                "row y (from the bottom)",
                "color 2",
            ],
        ),
    ];
    for (file, texts) in expect {
        let svg = fs::read_to_string(dir.join("figures").join(file)).unwrap();
        common::check_xml(&svg).unwrap_or_else(|e| panic!("{file}: {e}"));
        for t in texts {
            assert!(svg.contains(t), "{file} lacks {t:?}");
        }
    }
}

#[test]
fn ecdf_figure_shows_bands_in_side_colours() {
    let tmp = tempfile::tempdir().unwrap();
    let dir = tmp.path().join("rep");
    write_report(
        &dir,
        &common::run(vec![common::same_law("c", false, 0.01)]),
        &ReportExtras::default(),
        false,
    )
    .unwrap();
    let svg = fs::read_to_string(dir.join("figures/c-ecdf.svg")).unwrap();
    // One shaded band per side, teal and burnt orange.
    assert_eq!(svg.matches("<polygon").count(), 2);
    assert!(svg.contains("#0B6E74"));
    assert!(svg.contains("#C8581E"));
}

#[test]
fn checker_rejects_broken_svg() {
    // The well-formedness check itself must be able to fail.
    assert!(common::check_xml("<svg><text>a</svg>").is_err());
    assert!(common::check_xml("<svg><g></g>").is_err());
    assert!(common::check_xml("<svg a=\"1></svg>").is_err());
    assert!(common::check_xml("<svg></svg><svg></svg>").is_err());
    assert!(common::check_xml("<svg><g/><g></g></svg>").is_ok());
}
