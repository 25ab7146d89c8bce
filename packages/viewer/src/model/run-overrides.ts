/**
 * The values a run in the page uses, by the same rule as `conebook run` and `conebook verify`
 * (`recordedRunSettings` of the kernel): the numeric template parameters of the header as overrides, and the
 * control values recorded in the document, used while a control's default is the one recorded beside it. So a
 * document run in the page and verified by the CLI meets the same values (tests/browser checks both give the
 * same outputs for every notebook).
 */
export { recordedRunSettings } from "@conebook/kernel";
