//! "Did you mean ...?" for misspelt names: the closest candidate by the
//! optimal string alignment distance (restricted Damerau-Levenshtein:
//! insertions, deletions, substitutions and transpositions of two adjacent
//! characters, no substring edited twice; Damerau 1964, and the
//! restriction as described by Boytsov 2011, "Indexing methods for
//! approximate dictionary searching", ACM JEA 16; citations from memory).
//!
//! Names are compared after folding: lower case, with `_`, `-` and spaces
//! removed, so `line_width`, `line-width` and `LineWidth` are the same
//! name (distance 0). A candidate is suggested only when the distance
//! between the folded forms is at most max(1, n/3), n being the number of
//! characters of the folded word: one slip in a short name, about one in
//! three characters in a long one. Further away, a suggestion is more
//! likely to mislead than to help, so none is made. Ties go to the
//! candidate listed first.

/// The folded form of a name: lower case, separators `_`, `-` and spaces
/// removed.
pub fn fold(name: &str) -> String {
    name.chars()
        .filter(|c| !matches!(c, '_' | '-' | ' '))
        .flat_map(char::to_lowercase)
        .collect()
}

/// The optimal string alignment distance between `a` and `b`, counted in
/// characters (Unicode scalar values).
pub fn osa_distance(a: &str, b: &str) -> usize {
    let a: Vec<char> = a.chars().collect();
    let b: Vec<char> = b.chars().collect();
    let (n, m) = (a.len(), b.len());
    // Three rows of the dynamic-programming table: i-2, i-1 and i.
    let mut two_back: Vec<usize> = vec![0; m + 1];
    let mut prev: Vec<usize> = (0..=m).collect();
    let mut cur: Vec<usize> = vec![0; m + 1];
    for i in 1..=n {
        cur[0] = i;
        for j in 1..=m {
            let cost = usize::from(a[i - 1] != b[j - 1]);
            let mut d = (prev[j] + 1).min(cur[j - 1] + 1).min(prev[j - 1] + cost);
            if i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1] {
                d = d.min(two_back[j - 2] + 1);
            }
            cur[j] = d;
        }
        std::mem::swap(&mut two_back, &mut prev);
        std::mem::swap(&mut prev, &mut cur);
    }
    prev[m]
}

/// The largest distance at which a suggestion is still made for a word
/// whose folded form has `len` characters: max(1, len / 3).
pub fn max_distance(len: usize) -> usize {
    (len / 3).max(1)
}

/// The candidate closest to `word`, if one is close enough (see the module
/// documentation). A candidate equal to `word` after folding always wins;
/// a word that folds to nothing gets no suggestion.
pub fn closest<'a>(word: &str, candidates: &[&'a str]) -> Option<&'a str> {
    let w = fold(word);
    if w.is_empty() {
        return None;
    }
    let limit = max_distance(w.chars().count());
    let mut best: Option<(usize, &'a str)> = None;
    for &c in candidates {
        let d = osa_distance(&w, &fold(c));
        if d <= limit && best.is_none_or(|(bd, _)| d < bd) {
            best = Some((d, c));
        }
    }
    best.map(|(_, c)| c)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn separators_and_case_fold_to_the_same_name() {
        assert_eq!(fold("Line_Width"), "linewidth");
        assert_eq!(fold("line-width"), fold("LineWidth"));
        assert_eq!(
            closest("LineWidth", &["line_colour", "line_width"]),
            Some("line_width")
        );
    }
}
