package dev.erg.report;

/** Text rules of the HTML page shared by its view model and its charts. */
final class Html {
    private Html() {
    }

    /** True for a character a page may carry as it is: not a control character other than tab and line feed. */
    static boolean allowed(char c) {
        return !((c < 0x20 && c != '\n' && c != '\t') || c == 0x7f || (c >= 0x80 && c < 0xa0) || c == '\uFFFE'
                || c == '\uFFFF');
    }

    /** {@code s} with every character a page should not carry as U+FFFD (the template escapes markup). */
    static String text(String s) {
        if (s == null) {
            return "";
        }
        StringBuilder b = new StringBuilder(s.length());
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            b.append(allowed(c) ? c : '\uFFFD');
        }
        return b.toString();
    }
}
