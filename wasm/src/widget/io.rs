//! What a calculator asks of the page's script to share and save cases (`assets/case-io.js`,
//! handed to `mountAll`): a link made from a case, a file downloaded, a file picked, and the case
//! a link to the page carried. Compressing and reading files are the browser's own streams, so
//! they stay in script; what the case is, and what is done with what comes back, is Rust's.

use js_sys::{Function, Reflect};
use wasm_bindgen::{JsCast, JsValue};

/// The page script's helpers, or nothing when the page gave none.
#[derive(Clone)]
pub(super) struct Io(JsValue);

impl Io {
    pub(super) fn new(io: &JsValue) -> Io {
        Io(io.clone())
    }

    fn call(&self, name: &str, arguments: &[JsValue]) -> bool {
        let Some(function) =
            Reflect::get(&self.0, &name.into()).ok().and_then(|f| f.dyn_into::<Function>().ok())
        else {
            return false;
        };
        let arguments: js_sys::Array = arguments.iter().collect();
        function.apply(&self.0, &arguments).is_ok()
    }

    /// Asks for a link to the page carrying `text` for calculator `calculator` (from 1);
    /// `done` is called with the link, or with something other than a string if none could be
    /// made. `false` when the page cannot make links.
    pub(super) fn link(&self, calculator: usize, text: &str, done: &Function) -> bool {
        self.call("link", &[JsValue::from(calculator as u32), JsValue::from_str(text), done.into()])
    }

    /// Offers `text` for download as the file `name` of media type `kind`.
    pub(super) fn download(&self, name: &str, kind: &str, text: &str) -> bool {
        self.call("download", &[name.into(), kind.into(), text.into()])
    }

    /// Lets the reader pick a file; `done` is called with its text.
    pub(super) fn pick_file(&self, done: &Function) -> bool {
        self.call("pickFile", &[done.into()])
    }

    /// The case a link to the page carried for calculator `calculator` (from 1): its text, or
    /// why it could not be read.
    pub(super) fn incoming(&self, calculator: usize) -> Option<Result<String, String>> {
        let incoming = Reflect::get(&self.0, &"incoming".into()).ok().filter(JsValue::is_object)?;
        let place = Reflect::get(&incoming, &"calculator".into()).ok()?.as_f64()?;
        if place != calculator as f64 {
            return None;
        }
        let text = Reflect::get(&incoming, &"text".into()).ok().and_then(|t| t.as_string());
        let error = Reflect::get(&incoming, &"error".into()).ok().and_then(|t| t.as_string());
        match (text, error) {
            (Some(text), _) => Some(Ok(text)),
            (None, error) => Some(Err(error.unwrap_or_else(|| "the link's case could not be read".into()))),
        }
    }
}
