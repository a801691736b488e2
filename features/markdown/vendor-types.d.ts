// markdown-it 10 (the parser inside react-native-markdown-display) ships no types; this is the part Causeway uses.
declare module 'markdown-it' {
  export interface Token {
    type: string;
    tag: string;
    attrs: [string, string][] | null;
    nesting: number;
    content: string;
    children: Token[] | null;
    markup: string;
    block: boolean;
    attrSet(name: string, value: string): void;
    attrGet(name: string): string | null;
  }
  export interface StateCore {
    tokens: Token[];
  }
  export interface MarkdownItOptions {
    html?: boolean;
    linkify?: boolean;
    typographer?: boolean;
    breaks?: boolean;
    maxNesting?: number;
  }
  export interface MarkdownIt {
    parse(src: string, env: object): Token[];
    validateLink: (url: string) => boolean;
    core: { ruler: { push(name: string, rule: (state: StateCore) => void): void } };
    use(plugin: (md: MarkdownIt) => void): MarkdownIt;
    options: MarkdownItOptions;
  }
  const MarkdownItFactory: (options?: MarkdownItOptions) => MarkdownIt;
  export default MarkdownItFactory;
}
