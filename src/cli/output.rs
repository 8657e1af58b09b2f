//! Writing an output folder whole or not at all: files go into a temporary
//! sibling folder, which is renamed into place at the end.

use std::path::{Path, PathBuf};

use lotwright::error::{Error, Result};

pub struct Target {
    path: PathBuf,
    force: bool,
}

fn output_error(path: &Path, message: impl Into<String>) -> Error {
    Error::Output {
        path: path.to_path_buf(),
        message: message.into(),
    }
}

impl Target {
    /// Checks that `out` may be written: not the scenario folder or inside
    /// it, not holding inputs, not existing unless `force`.
    pub fn prepare(out: &Path, scenario: &Path, force: bool) -> Result<Target> {
        let absolute = |p: &Path| std::path::absolute(p).unwrap_or_else(|_| p.to_path_buf());
        let out_abs = absolute(out);
        let scenario_abs = std::fs::canonicalize(scenario).unwrap_or_else(|_| absolute(scenario));
        let out_resolved = std::fs::canonicalize(&out_abs).unwrap_or(out_abs.clone());
        if out_resolved == scenario_abs || scenario_abs.starts_with(&out_resolved) {
            return Err(output_error(
                out,
                "this folder holds the scenario's own inputs; choose another --out folder",
            ));
        }
        if out.exists() {
            if !out.is_dir() {
                return Err(output_error(out, "it exists and is not a folder"));
            }
            if out.join("scenario.toml").exists() || out.join("items.csv").exists() {
                return Err(output_error(
                    out,
                    "this folder holds scenario inputs; choose another --out folder",
                ));
            }
            if !force {
                return Err(output_error(
                    out,
                    "the folder exists; add --force to replace it",
                ));
            }
        }
        match out_abs.parent() {
            Some(parent) if parent.as_os_str().is_empty() || parent.is_dir() => {}
            _ => return Err(output_error(out, "its parent folder does not exist")),
        }
        Ok(Target {
            path: out_abs,
            force,
        })
    }

    /// Writes every file into a temporary sibling, then renames it into place.
    pub fn write(&self, files: &[(&str, Vec<u8>)]) -> Result<()> {
        let name = self
            .path
            .file_name()
            .map(|n| n.to_string_lossy().into_owned())
            .unwrap_or_else(|| "out".into());
        let parent = self.path.parent().unwrap_or(Path::new("."));
        let staging = parent.join(format!(".{name}.lotwright-{}", std::process::id()));
        let fail = |e: std::io::Error| output_error(&self.path, e.to_string());
        let _ = std::fs::remove_dir_all(&staging);
        std::fs::create_dir(&staging).map_err(fail)?;
        let written = (|| -> std::io::Result<()> {
            for (file, bytes) in files {
                std::fs::write(staging.join(file), bytes)?;
            }
            Ok(())
        })();
        if let Err(e) = written {
            let _ = std::fs::remove_dir_all(&staging);
            return Err(fail(e));
        }
        if self.path.exists() && self.force {
            // Move the old folder aside first, so a failed rename keeps it.
            let old = parent.join(format!(".{name}.lotwright-old-{}", std::process::id()));
            std::fs::rename(&self.path, &old).map_err(fail)?;
            if let Err(e) = std::fs::rename(&staging, &self.path) {
                let _ = std::fs::rename(&old, &self.path);
                let _ = std::fs::remove_dir_all(&staging);
                return Err(fail(e));
            }
            let _ = std::fs::remove_dir_all(&old);
        } else if let Err(e) = std::fs::rename(&staging, &self.path) {
            let _ = std::fs::remove_dir_all(&staging);
            return Err(fail(e));
        }
        Ok(())
    }
}
