//! The offer to open again the reader's edits that were set aside because they could not be
//! solved in time when the page opened: the page shows its example instead, and nothing typed
//! is lost.

/// The offer, placed under the calculator's head. Its button carries `data-action="reopen"`.
pub fn offer_html() -> &'static str {
    "<div class=\"mb-offer\" role=\"status\"><p class=\"mb-offer-note\">Your last edits on this calculator \
     could not be solved in time when the page opened, so it shows the page's example. Your edits are kept \
     in this browser.</p><button type=\"button\" class=\"mb-button\" data-action=\"reopen\">Open my last \
     edits again</button></div>"
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_offer_is_a_button_the_widget_listens_for_and_nothing_inline() {
        let html = offer_html();
        assert!(html.contains("<button type=\"button\" class=\"mb-button\" data-action=\"reopen\">"));
        assert!(!html.contains(" style="), "{html}");
        // No inline handler (` onclick="…"`): the page's policy would block it.
        let handler = html.match_indices(" on").any(|(i, _)| {
            let rest = &html[i + 3..];
            let name = rest.find(|c: char| !c.is_ascii_lowercase()).unwrap_or(0);
            name > 0 && rest[name..].starts_with("=\"")
        });
        assert!(!handler, "{html}");
    }
}
