/**
 * Paraxia design tokens. Loaded by src/styles/index.css through `@config`.
 *
 * The look is a lab notebook, not a dashboard: warm paper, dark ink, hairline
 * rules, a faint measurement grid behind plots, and ONE signal colour that
 * only ever marks where focus is (fitted peak, selected frame, best-focus
 * marker). Conformity has its own three colours and is never shown by colour
 * alone (see ConformityMark: word + shape + colour).
 *
 * name            hex       role
 * paper           #F5F1E6   page background (warm paper)
 * sheet           #FBF9F3   panels, cards, inputs: a fresh sheet on the pad
 * shade           #ECE6D6   table heads, hover rows, sunken wells
 * rule            #D8CFBA   hairline borders and table rules
 * rule-strong     #B9AD92   input borders, emphasised rules
 * grid            #EDE7D8   minor measurement-grid lines in plot areas (faint on purpose)
 * grid-major      #DFD6C1   major measurement-grid lines (every 5th)
 * ink             #1D2229   body text, headings, primary buttons
 * ink-soft        #454C57   secondary text                (7.7:1 on paper)
 * ink-faint       #5F6570   units, captions, hints        (5.2:1 on paper)
 * focus           #2747C9   cobalt: WHERE FOCUS IS, nothing else
 * focus-tint      #DFE4F7   background behind a focus marker or selection
 * conforms        #24693A   "Conforms" (with ✓ in a circle)
 * conforms-tint   #DDEADD
 * nonconform      #A3271F   "Does not conform" (with ✕ in a square)
 * nonconform-tint #F4DDD8
 * undecided       #87600A   "Undecided" (with ? in a diamond)
 * undecided-tint  #F1E6C8
 * caution         #E9B300   safety triangle fill only (ISO 7010 warning yellow)
 *
 * Keyboard focus is drawn as an ink outline, deliberately not cobalt, so the
 * signal colour keeps its single meaning.
 * All text colours reach WCAG AA (≥ 4.5:1) on paper, sheet and shade.
 */
import type { Config } from 'tailwindcss';

export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        paper: '#F5F1E6',
        sheet: '#FBF9F3',
        shade: '#ECE6D6',
        rule: { DEFAULT: '#D8CFBA', strong: '#B9AD92' },
        grid: { DEFAULT: '#EDE7D8', major: '#DFD6C1' },
        ink: { DEFAULT: '#1D2229', soft: '#454C57', faint: '#5F6570' },
        focus: { DEFAULT: '#2747C9', tint: '#DFE4F7' },
        conforms: { DEFAULT: '#24693A', tint: '#DDEADD' },
        nonconform: { DEFAULT: '#A3271F', tint: '#F4DDD8' },
        undecided: { DEFAULT: '#87600A', tint: '#F1E6C8' },
        caution: '#E9B300',
      },
      fontFamily: {
        serif: ['"Source Serif 4"', 'Georgia', 'ui-serif', 'serif'],
        sans: ['"IBM Plex Sans"', 'ui-sans-serif', 'system-ui', 'sans-serif'],
        mono: ['"IBM Plex Mono"', 'ui-monospace', 'Menlo', 'monospace'],
      },
      // A compact scale for dense bench screens; `result` is the big numeral of a measured value.
      fontSize: {
        caption: ['0.75rem', { lineHeight: '1rem', letterSpacing: '0.01em' }],
        small: ['0.8125rem', { lineHeight: '1.2rem' }],
        body: ['0.9375rem', { lineHeight: '1.45rem' }],
        lead: ['1.0625rem', { lineHeight: '1.6rem' }],
        'title-sm': ['1.1875rem', { lineHeight: '1.5rem' }],
        title: ['1.5rem', { lineHeight: '1.9rem' }],
        'title-lg': ['2rem', { lineHeight: '2.4rem', letterSpacing: '-0.01em' }],
        result: ['2.75rem', { lineHeight: '1', letterSpacing: '-0.02em' }],
      },
      spacing: {
        bar: '3.25rem',
        rail: '15rem',
        measure: '38rem',
      },
      borderRadius: {
        hair: '2px',
        sheet: '4px',
        well: '6px',
      },
      boxShadow: {
        sheet: '0 1px 0 rgba(29, 34, 41, 0.04), 0 1px 3px rgba(29, 34, 41, 0.06)',
      },
    },
  },
} satisfies Config;
