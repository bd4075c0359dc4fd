package dev.erg.workload;

import dev.erg.error.BadInputException;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.regex.PatternSyntaxException;

/**
 * Deployed precisions given per node-name pattern, overriding what the model says. Rules are tried
 * in the order given and the <b>first</b> rule that matches a node decides its precision; a node no
 * rule matches keeps the model's precision (or the profile's default).
 *
 * <p>A rule in text form is {@code PATTERN[@OP]=PRECISION}:
 * <ul>
 *   <li>{@code PATTERN} is a glob over the whole node name ({@code *} any characters, {@code /}
 *       included; {@code ?} one character), or a regular expression over the whole name when written
 *       {@code re:EXPR};</li>
 *   <li>{@code @OP} (optional) limits the rule to one ONNX operator type, e.g. {@code @Conv};</li>
 *   <li>{@code PRECISION} is {@code wNaM} (weights N bits, activations M bits), {@code wN} or
 *       {@code aM} (the other operand keeps its precision); N and M from 1 to 32.</li>
 * </ul>
 * Examples: {@code /backbone/*@Conv=w4a8}, {@code re:^/head/.*=w8a8}, {@code *=w2}.
 */
public final class PrecisionOverrides {
    public static final PrecisionOverrides NONE = new PrecisionOverrides(List.of());
    private static final Pattern TEXT = Pattern.compile("(.+?)(?:@([A-Za-z][A-Za-z0-9_]*))?=(w([0-9]+))?(a([0-9]+))?");

    /** One rule: a name pattern, an optional operator type, and the bits it sets (0: keep the operand's). */
    public static final class Rule {
        private final String text;
        private final Pattern name;
        private final String opType;
        private final int weightBits;
        private final int activationBits;

        private Rule(String text, Pattern name, String opType, int weightBits, int activationBits) {
            this.text = text;
            this.name = name;
            this.opType = opType;
            this.weightBits = weightBits;
            this.activationBits = activationBits;
        }

        /** A glob rule ({@code *} any characters, {@code ?} one); {@code opType} null for any operator. */
        public static Rule glob(String glob, String opType, int weightBits, int activationBits) {
            return make(glob + (opType == null ? "" : "@" + opType) + "=" + bitsText(weightBits, activationBits),
                    Pattern.compile(globToRegex(glob)), opType, weightBits, activationBits);
        }

        /** A regular-expression rule, matched against the whole node name. */
        public static Rule regex(String regex, String opType, int weightBits, int activationBits) {
            Pattern p;
            try {
                p = Pattern.compile(regex);
            } catch (PatternSyntaxException e) {
                throw new BadInputException("precision rule \"re:" + regex + "\": not a valid regular expression ("
                        + e.getDescription() + ")");
            }
            return make("re:" + regex + (opType == null ? "" : "@" + opType) + "=" + bitsText(weightBits, activationBits),
                    p, opType, weightBits, activationBits);
        }

        private static Rule make(String text, Pattern p, String opType, int w, int a) {
            if (w < 0 || w > 32 || a < 0 || a > 32 || (w == 0 && a == 0)) {
                throw new BadInputException("precision rule \"" + text + "\": give weight and/or activation bits "
                        + "from 1 to 32 (e.g. w4a8, w4 or a8)");
            }
            return new Rule(text, p, opType, w, a);
        }

        private static String bitsText(int w, int a) {
            return (w > 0 ? "w" + w : "") + (a > 0 ? "a" + a : "");
        }

        public boolean matches(String nodeName, String op) {
            return (opType == null || opType.equals(op)) && name.matcher(nodeName == null ? "" : nodeName).matches();
        }

        /** Weight bits the rule sets, or 0 when it leaves weights alone. */
        public int weightBits() {
            return weightBits;
        }

        /** Activation bits the rule sets, or 0 when it leaves activations alone. */
        public int activationBits() {
            return activationBits;
        }

        /** The rule as text, {@code PATTERN[@OP]=wNaM}. */
        @Override
        public String toString() {
            return text;
        }
    }

    private final List<Rule> rules;

    public PrecisionOverrides(List<Rule> rules) {
        this.rules = List.copyOf(rules);
    }

    /**
     * Parses rules in text form ({@code PATTERN[@OP]=wNaM}), in order.
     *
     * @throws BadInputException naming the first malformed rule
     */
    public static PrecisionOverrides parse(List<String> texts) {
        List<Rule> out = new ArrayList<>();
        for (String t : texts) {
            out.add(parseRule(t));
        }
        return new PrecisionOverrides(out);
    }

    /** One rule in text form. */
    public static Rule parseRule(String text) {
        Matcher m = TEXT.matcher(text == null ? "" : text.strip());
        if (!m.matches() || (m.group(3) == null && m.group(5) == null)) {
            throw new BadInputException("precision rule \"" + text + "\": write PATTERN[@OP]=wNaM, e.g. "
                    + "/backbone/*@Conv=w4a8 (or wN, aM; re:EXPR for a regular expression)");
        }
        int w = m.group(4) == null ? 0 : bits(text, m.group(4));
        int a = m.group(6) == null ? 0 : bits(text, m.group(6));
        String pattern = m.group(1);
        String op = m.group(2);
        return pattern.startsWith("re:") ? Rule.regex(pattern.substring(3), op, w, a) : Rule.glob(pattern, op, w, a);
    }

    private static int bits(String text, String digits) {
        if (digits.length() > 2) {
            throw new BadInputException("precision rule \"" + text + "\": bits must be from 1 to 32");
        }
        return Integer.parseInt(digits);
    }

    public List<Rule> rules() {
        return rules;
    }

    public boolean isEmpty() {
        return rules.isEmpty();
    }

    /** The first rule that matches the node, or null. */
    public Rule match(String nodeName, String opType) {
        for (Rule r : rules) {
            if (r.matches(nodeName, opType)) {
                return r;
            }
        }
        return null;
    }

    static String globToRegex(String glob) {
        StringBuilder b = new StringBuilder();
        StringBuilder lit = new StringBuilder();
        for (int i = 0; i < glob.length(); i++) {
            char c = glob.charAt(i);
            if (c == '*' || c == '?') {
                if (lit.length() > 0) {
                    b.append(Pattern.quote(lit.toString()));
                    lit.setLength(0);
                }
                b.append(c == '*' ? ".*" : ".");
            } else {
                lit.append(c);
            }
        }
        if (lit.length() > 0) {
            b.append(Pattern.quote(lit.toString()));
        }
        return b.toString();
    }
}
