declare module 'wav-decoder' {
  interface Decoded {
    sampleRate: number;
    channelData: Float32Array[];
  }
  const WavDecoder: { decode: { sync(buffer: Uint8Array | ArrayBuffer): Decoded } };
  export default WavDecoder;
}
