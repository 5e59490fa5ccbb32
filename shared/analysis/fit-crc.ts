// CRC-16/ARC (poly 0x8005 reflected = 0xA001, init 0, no final XOR), the checksum
// the FIT protocol puts after the header and after the data. Nibble table as in the FIT SDK.
const NIBBLE_TABLE = new Uint16Array([
  0x0000, 0xcc01, 0xd801, 0x1400, 0xf001, 0x3c00, 0x2800, 0xe401,
  0xa001, 0x6c00, 0x7800, 0xb401, 0x5000, 0x9c01, 0x8801, 0x4400,
]);

export function crc16Arc(bytes: Uint8Array, start = 0, end = bytes.length): number {
  let crc = 0;
  for (let i = start; i < end; i++) {
    const byte = bytes[i];
    crc = (crc >>> 4) ^ NIBBLE_TABLE[crc & 0xf] ^ NIBBLE_TABLE[byte & 0xf];
    crc = (crc >>> 4) ^ NIBBLE_TABLE[crc & 0xf] ^ NIBBLE_TABLE[byte >>> 4];
  }
  return crc;
}
