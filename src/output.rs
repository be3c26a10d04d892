//! Writing outputs safely: atomically (a temporary file in the same folder,
//! then a rename, so a reader never sees half a file and an interrupted
//! write leaves the old file intact), and never over one of the inputs.

use std::io::Write;
use std::path::{Path, PathBuf};

use crate::error::{Error, Result};

/// Refuse to write `out` if it names the same file as one of `inputs`.
pub fn check_not_an_input(out: &Path, inputs: &[PathBuf]) -> Result<()> {
    let canon = |p: &Path| std::fs::canonicalize(p).ok();
    let Some(out_c) = canon(out) else {
        return Ok(()); // does not exist yet, so it is not an input
    };
    for i in inputs {
        if canon(i).as_ref() == Some(&out_c) {
            return Err(Error::Usage {
                what: "output".into(),
                message: format!(
                    "'{}' is also an input; choose another output path (inputs are never overwritten)",
                    out.display()
                ),
            });
        }
    }
    Ok(())
}

/// Write `bytes` to `path` atomically.
pub fn write_atomic(path: &Path, bytes: &[u8]) -> Result<()> {
    let write_err = |source: std::io::Error| Error::Write {
        path: path.to_path_buf(),
        source,
    };
    let dir = match path.parent() {
        Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
        _ => PathBuf::from("."),
    };
    let name = path
        .file_name()
        .ok_or_else(|| write_err(std::io::Error::other("the path names no file")))?;
    let mut tmp_name = std::ffi::OsString::from(".");
    tmp_name.push(name);
    tmp_name.push(format!(".{}.tmp", std::process::id()));
    let tmp = dir.join(tmp_name);
    let result = (|| {
        let mut f = std::fs::File::create(&tmp)?;
        f.write_all(bytes)?;
        f.sync_all()?;
        if crate::batch::interrupted() {
            // An interrupted run starts no new file: the finished
            // temporary file is removed below instead of renamed.
            return Err(std::io::Error::new(
                std::io::ErrorKind::Interrupted,
                "the run was interrupted",
            ));
        }
        std::fs::rename(&tmp, path)
    })();
    if let Err(e) = result {
        let _ = std::fs::remove_file(&tmp);
        return Err(write_err(e));
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn writes_and_replaces_atomically_without_leftovers() {
        let dir = std::env::temp_dir().join(format!("hueproof-out-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let p = dir.join("a.txt");
        write_atomic(&p, b"one").unwrap();
        write_atomic(&p, b"two").unwrap();
        assert_eq!(std::fs::read(&p).unwrap(), b"two");
        let names: Vec<_> = std::fs::read_dir(&dir)
            .unwrap()
            .map(|e| e.unwrap().file_name())
            .collect();
        assert_eq!(names.len(), 1, "{names:?}");
        assert!(check_not_an_input(&p, std::slice::from_ref(&p)).is_err());
        assert!(check_not_an_input(&dir.join("new.txt"), std::slice::from_ref(&p)).is_ok());
        std::fs::remove_dir_all(&dir).unwrap();
    }

    #[test]
    fn unwritable_folder_is_a_write_error() {
        let e = write_atomic(Path::new("/nonexistent-folder-hueproof/x.svg"), b"x").unwrap_err();
        assert_eq!(e.exit_kind(), crate::ExitKind::OutputFailed);
        assert!(e.to_string().contains("/nonexistent-folder-hueproof/x.svg"));
    }
}
