package grid

// Spec names the 3GPP release whose tables and rules gridloom follows. It is
// pinned so that a figure, a JSON document or a finding can be traced to the
// text it came from; README's "Which release" lists the documents and the
// places where a table was read from another version of the text.
const Spec = "3GPP Release 17"
