//! Spelling suggestions: the optimal string alignment distance against the
//! `strsim` crate's `osa_distance` (a general-purpose reference library),
//! and worked examples.

use hueproof::spec::suggest::{closest, fold, max_distance, osa_distance};
use proptest::prelude::*;

#[test]
fn worked_examples_of_the_distance() {
    // Hand-worked: one transposition, one substitution, one insertion.
    assert_eq!(osa_distance("colour", "clouor"), 2);
    assert_eq!(osa_distance("width", "wdith"), 1);
    assert_eq!(osa_distance("legend", "legand"), 1);
    assert_eq!(osa_distance("title", "titles"), 1);
    assert_eq!(osa_distance("", "abc"), 3);
    // The textbook case that separates OSA from unrestricted
    // Damerau-Levenshtein: CA -> ABC is 3 by OSA (no substring edited
    // twice) and 2 by the unrestricted distance (Boytsov 2011).
    assert_eq!(osa_distance("CA", "ABC"), 3);
    assert_eq!(strsim::osa_distance("CA", "ABC"), 3);
    assert_eq!(strsim::damerau_levenshtein("CA", "ABC"), 2);
    // Characters, not bytes.
    assert_eq!(osa_distance("größe", "grösse"), 2);
    assert_eq!(strsim::osa_distance("größe", "grösse"), 2);
}

#[test]
fn suggestions_for_misspelt_keys() {
    let keys = [
        "title",
        "subtitle",
        "legend",
        "line_width",
        "line_colour",
        "palette",
    ];
    assert_eq!(closest("titel", &keys), Some("title"));
    assert_eq!(closest("ledgend", &keys), Some("legend"));
    assert_eq!(closest("line-width", &keys), Some("line_width"));
    assert_eq!(closest("LineWidth", &keys), Some("line_width"));
    assert_eq!(closest("LINE WIDTH", &keys), Some("line_width"));
    assert_eq!(closest("linecolor", &keys), Some("line_colour"));
    assert_eq!(closest("pallete", &keys), Some("palette"));
    // Too far: no suggestion rather than a misleading one.
    assert_eq!(closest("projection", &keys), None);
    assert_eq!(closest("xy", &keys), None);
    assert_eq!(closest("anything", &[]), None);
    assert_eq!(closest("__", &["a"]), None);
}

#[test]
fn ties_go_to_the_first_candidate() {
    assert_eq!(closest("bat", &["cat", "hat"]), Some("cat"));
    assert_eq!(closest("bat", &["hat", "cat"]), Some("hat"));
    // An exact match after folding beats an earlier near miss.
    assert_eq!(
        closest("line_widths", &["line_width", "LineWidths"]),
        Some("LineWidths")
    );
}

#[test]
fn the_limit_is_max_of_one_and_a_third() {
    // "abcdef" folds to 6 characters: two edits allowed, three not.
    assert_eq!(max_distance(0), 1);
    assert_eq!(max_distance(5), 1);
    assert_eq!(max_distance(6), 2);
    assert_eq!(max_distance(12), 4);
    assert_eq!(closest("abcdef", &["abcdxy"]), Some("abcdxy"));
    assert_eq!(closest("abcdef", &["abcxyz"]), None);
    // Short words always allow one edit.
    assert_eq!(closest("ab", &["ax"]), Some("ax"));
    assert_eq!(closest("ab", &["xy"]), None);
}

proptest! {
    #[test]
    fn distance_matches_strsim_osa_distance(a in "[abc_é]{0,9}", b in "[abc_é]{0,9}") {
        // A small alphabet makes transpositions and repeats common.
        prop_assert_eq!(osa_distance(&a, &b), strsim::osa_distance(&a, &b));
    }

    #[test]
    fn distance_matches_strsim_on_any_text(a in "\\PC{0,12}", b in "\\PC{0,12}") {
        prop_assert_eq!(osa_distance(&a, &b), strsim::osa_distance(&a, &b));
    }

    #[test]
    fn folding_ignores_case_and_separators(w in "[a-z]{1,6}(_[a-z]{1,6}){0,2}") {
        let kebab = w.replace('_', "-");
        let camel: String = w
            .split('_')
            .map(|p| {
                let mut c = p.chars();
                c.next().map(|f| f.to_ascii_uppercase().to_string() + c.as_str()).unwrap_or_default()
            })
            .collect();
        prop_assert_eq!(fold(&kebab), fold(&w));
        prop_assert_eq!(fold(&camel), fold(&w));
        let cands = [w.as_str()];
        prop_assert_eq!(closest(&camel, &cands), Some(w.as_str()));
    }
}
