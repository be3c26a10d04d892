//! "Did you mean": the nearest known name to a misspelt one.

/// The candidate nearest to `word` by optimal string alignment distance,
/// if it is close enough (at most a third of the word's length, at least
/// 1). Case and the separators `-`/`_` are ignored.
pub fn closest<'a>(word: &str, candidates: &[&'a str]) -> Option<&'a str> {
    let norm = |s: &str| -> Vec<char> {
        s.chars()
            .filter(|c| *c != '-' && *c != '_')
            .flat_map(char::to_lowercase)
            .collect()
    };
    let w = norm(word);
    let limit = (w.len() / 3).max(1);
    let mut best: Option<(usize, &'a str)> = None;
    for c in candidates {
        let d = osa(&w, &norm(c));
        if d <= limit && best.is_none_or(|(bd, _)| d < bd) {
            best = Some((d, c));
        }
    }
    best.map(|(_, c)| c)
}

/// Optimal string alignment distance (Levenshtein plus adjacent
/// transpositions, each substring edited once).
pub fn osa(a: &[char], b: &[char]) -> usize {
    let (n, m) = (a.len(), b.len());
    let mut d = vec![vec![0usize; m + 1]; n + 1];
    for (i, row) in d.iter_mut().enumerate() {
        row[0] = i;
    }
    for (j, v) in d[0].iter_mut().enumerate() {
        *v = j;
    }
    for i in 1..=n {
        for j in 1..=m {
            let cost = usize::from(a[i - 1] != b[j - 1]);
            let mut v = (d[i - 1][j] + 1)
                .min(d[i][j - 1] + 1)
                .min(d[i - 1][j - 1] + cost);
            if i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1] {
                v = v.min(d[i - 2][j - 2] + 1);
            }
            d[i][j] = v;
        }
    }
    d[n][m]
}
