//! Key normalisation for the join.

/// Normalise a key: trim surrounding white space, fold to upper case
/// (Unicode simple case mapping), and drop leading zeros from keys made
/// only of ASCII digits (`"08031"` and `"8031"` both become `"8031"`;
/// `"000"` becomes `"0"`).
pub fn normalize_key(key: &str) -> String {
    let t = key.trim();
    if !t.is_empty() && t.bytes().all(|b| b.is_ascii_digit()) {
        let s = t.trim_start_matches('0');
        return if s.is_empty() { "0".into() } else { s.into() };
    }
    t.to_uppercase()
}
